import type { Response } from 'supertest';
import type { CaseDetail, VisitView } from '@tidemark/shared';
import { createCase, createClinicalWorld, daysAgo, expectStatus, siteBody, visitBody, type ClinicalWorld } from '../support/clinical-fixtures';
import type { ApiClient } from '../support/test-app';
import { queryRows } from '../support/test-database';

/*
 * Two people saving the same record at the same moment (optimistic locking, STACK-NOTES 13: the
 * version check sits in the UPDATE itself). The audit lead and the case's clinician read the same
 * visit, then both save with the version they read, sent together: exactly one wins, the other
 * gets 409 with the current version; the winner's values are stored and nothing of the loser's
 * is merged in; the loser reloads and saves again, so nothing is lost; the change history holds
 * exactly the entries of the two saves. The same for recording a recall (POST …/visits), which
 * is how a recall is first saved. Each race runs a few rounds.
 */

const ROUNDS = 3;

interface ChangeRow {
  entity: string;
  field: string;
  old: string | null;
  new: string | null;
  reason: string | null;
  by: number;
}

async function changesOf(w: ClinicalWorld, caseId: number): Promise<ChangeRow[]> {
  const rows = await queryRows<ChangeRow>(
    w.t.dataSource,
    'SELECT entity, field, old_value AS "old", new_value AS "new", reason, changed_by_id AS "by" FROM change_record WHERE case_id = :caseId ORDER BY id',
    { caseId },
  );
  return rows.map((row) => ({ ...row, by: Number(row.by) }));
}

async function readingsOf(w: ClinicalWorld, visitId: number): Promise<Record<number, number>> {
  const rows = await queryRows<{ site: number; ref: number }>(w.t.dataSource, 'SELECT site_id AS "site", ref_gm AS "ref" FROM site_measurement WHERE visit_id = :visitId', { visitId });
  return Object.fromEntries(rows.map((row) => [Number(row.site), Number(row.ref)]));
}

async function visitRow(w: ClinicalWorld, visitId: number): Promise<{ version: number; pain: number }> {
  const [row] = await queryRows<{ version: number; pain: number }>(w.t.dataSource, 'SELECT version, pain FROM visit WHERE id = :visitId', { visitId });
  return { version: Number(row.version), pain: Number(row.pain) };
}

function byStatus(responses: Response[], status: number): number {
  const index = responses.findIndex((response) => response.status === status);
  if (index < 0) throw new Error(`No ${status} among ${responses.map((response) => response.status).join(', ')}`);
  return index;
}

describe('concurrent saves: one wins, the other is told, nothing is lost', () => {
  let w: ClinicalWorld;
  let clinician: ApiClient;
  let lead: ApiClient;

  beforeAll(async () => {
    w = await createClinicalWorld();
    clinician = w.as('clinician');
    lead = w.as('audit_lead');
  });
  afterAll(async () => {
    await w.close();
  });

  for (let round = 1; round <= ROUNDS; round++) {
    it(`visit correction (PATCH /api/visits/:id), round ${round}`, async () => {
      // The clinician's case: teeth 11 and 21, post-op REF→GM 10 mm, 6-week recall read 9.5 mm at both, pain 1.
      const registered = await createCase(clinician, w.ids.clinician, { sites: [siteBody({ tooth: 11 }), siteBody({ tooth: 21 })] });
      const [tooth11, tooth21] = registered.sites;
      const recorded = expectStatus(await clinician.post(`/api/cases/${registered.id}/visits`, visitBody([{ siteId: tooth11.id, refGm: 9.5 }, { siteId: tooth21.id, refGm: 9.5 }])), 201).body as CaseDetail;
      const historyBefore = await changesOf(w, registered.id);

      // Both open the same visit.
      const seen = await Promise.all([clinician, lead].map(async (client) => (expectStatus(await client.get(`/api/cases/${registered.id}`), 200).body as CaseDetail).visits[0]));
      expect(seen[0].version).toBe(seen[1].version);
      const version = seen[0].version;
      const visitId = recorded.visits[0].id;

      // Each corrects a different tooth and the pain score: a silent merge would keep both teeth.
      const edits = [
        { client: clinician, userId: w.ids.clinician, siteId: tooth11.id, pain: 3, reason: 'Re-read tooth 11 at the chair' },
        { client: lead, userId: w.ids.audit_lead, siteId: tooth21.id, pain: 5, reason: 'Lead re-read tooth 21' },
      ];
      const bodyOf = (edit: (typeof edits)[number], atVersion: number) => ({ version: atVersion, reason: edit.reason, pain: edit.pain, measurements: [{ siteId: edit.siteId, refGm: 9 }] });
      const responses = await Promise.all(edits.map((edit) => edit.client.patch(`/api/visits/${visitId}`, bodyOf(edit, version))));

      expect(responses.map((response) => response.status).sort()).toEqual([200, 409]);
      const winner = edits[byStatus(responses, 200)];
      const loser = edits[byStatus(responses, 409)];
      const refused = responses[byStatus(responses, 409)];
      expect(refused.body.error.code).toBe('conflict');
      expect(refused.body.error.details).toEqual({ currentVersion: version + 1 });

      // The winner's values only: the loser's tooth is still 9.5 mm, the pain is the winner's.
      expect(await readingsOf(w, visitId)).toEqual({ [winner.siteId]: 9, [loser.siteId]: 9.5 });
      expect(await visitRow(w, visitId)).toEqual({ version: version + 1, pain: winner.pain });
      const afterRace = (await changesOf(w, registered.id)).slice(historyBefore.length);
      expect(afterRace).toEqual([
        { entity: 'site_measurement', field: 'refGm', old: '9.5', new: '9', reason: winner.reason, by: winner.userId },
        { entity: 'visit', field: 'pain', old: '1', new: String(winner.pain), reason: winner.reason, by: winner.userId },
      ]);

      // The loser reloads, sees the winner's save, and saves again on top of it.
      const reloaded = (expectStatus(await loser.client.get(`/api/cases/${registered.id}`), 200).body as CaseDetail).visits[0] as VisitView;
      expect(reloaded.version).toBe(version + 1);
      expect(reloaded.pain).toBe(winner.pain);
      expectStatus(await loser.client.patch(`/api/visits/${visitId}`, bodyOf(loser, reloaded.version)), 200);

      expect(await readingsOf(w, visitId)).toEqual({ [winner.siteId]: 9, [loser.siteId]: 9 });
      expect(await visitRow(w, visitId)).toEqual({ version: version + 2, pain: loser.pain });
      expect((await changesOf(w, registered.id)).slice(historyBefore.length)).toEqual([
        ...afterRace,
        { entity: 'site_measurement', field: 'refGm', old: '9.5', new: '9', reason: loser.reason, by: loser.userId },
        { entity: 'visit', field: 'pain', old: String(winner.pain), new: String(loser.pain), reason: loser.reason, by: loser.userId },
      ]);
    });
  }

  for (let round = 1; round <= ROUNDS; round++) {
    it(`recording the same recall twice at once (POST /api/cases/:id/visits), round ${round}`, async () => {
      const registered = await createCase(clinician, w.ids.clinician, { sites: [siteBody({ tooth: 11 }), siteBody({ tooth: 21 })] });
      const [tooth11, tooth21] = registered.sites;
      const saves = [
        { client: clinician, userId: w.ids.clinician, readings: { [tooth11.id]: 9.5, [tooth21.id]: 9 }, pain: 2 },
        { client: lead, userId: w.ids.audit_lead, readings: { [tooth11.id]: 9, [tooth21.id]: 8.5 }, pain: 4 },
      ];
      const bodyOf = (save: (typeof saves)[number]) =>
        visitBody(
          Object.entries(save.readings).map(([siteId, refGm]) => ({ siteId: Number(siteId), refGm })),
          { intervalKey: '6w', visitDate: daysAgo(78), pain: save.pain },
        );
      const responses = await Promise.all(saves.map((save) => save.client.post(`/api/cases/${registered.id}/visits`, bodyOf(save))));

      expect(responses.map((response) => response.status).sort()).toEqual([201, 409]);
      const winner = saves[byStatus(responses, 201)];
      const loser = saves[byStatus(responses, 409)];
      expect(responses[byStatus(responses, 409)].body.error.code).toBe('conflict');

      const visits = await queryRows<{ id: number }>(w.t.dataSource, 'SELECT id FROM visit WHERE case_id = :caseId', { caseId: registered.id });
      expect(visits).toHaveLength(1);
      const visitId = Number(visits[0].id);
      expect(await readingsOf(w, visitId)).toEqual(winner.readings);
      expect(await visitRow(w, visitId)).toEqual({ version: 1, pain: winner.pain });
      // The first recall moves the case into recall once, not twice.
      expect(await changesOf(w, registered.id)).toEqual([{ entity: 'case', field: 'status', old: 'operated', new: 'in-recall', reason: 'First recall recorded.', by: winner.userId }]);
      const [caseRow] = await queryRows<{ version: number; status: string }>(w.t.dataSource, 'SELECT version, status FROM surgical_case WHERE id = :caseId', { caseId: registered.id });
      expect({ version: Number(caseRow.version), status: caseRow.status }).toEqual({ version: registered.version + 1, status: 'in-recall' });

      // The loser reloads, finds the recall recorded, and corrects it to their readings.
      const reloaded = (expectStatus(await loser.client.get(`/api/cases/${registered.id}`), 200).body as CaseDetail).visits[0];
      const reason = 'Second reading of the same recall';
      expectStatus(
        await loser.client.patch(`/api/visits/${visitId}`, {
          version: reloaded.version,
          reason,
          pain: loser.pain,
          measurements: Object.entries(loser.readings).map(([siteId, refGm]) => ({ siteId: Number(siteId), refGm })),
        }),
        200,
      );
      expect(await readingsOf(w, visitId)).toEqual(loser.readings);
      expect(await visitRow(w, visitId)).toEqual({ version: 2, pain: loser.pain });
      const corrections = (await changesOf(w, registered.id)).slice(1);
      expect(corrections).toEqual([
        ...[tooth11.id, tooth21.id].map((siteId) => ({ entity: 'site_measurement', field: 'refGm', old: String(winner.readings[siteId]), new: String(loser.readings[siteId]), reason, by: loser.userId })),
        { entity: 'visit', field: 'pain', old: String(winner.pain), new: String(loser.pain), reason, by: loser.userId },
      ]);
    });
  }
});
