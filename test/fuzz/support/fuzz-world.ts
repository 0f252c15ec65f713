import type { AuditView, CaseDetail, CycleView, Role, ScheduleView, StandardView } from '@tidemark/shared';
import type { OutboxEntry } from '../../../server/services/mail.service';
import { caseBody, createCase, createClinicalWorld, expectStatus, visitBody, type ClinicalWorld } from '../../api/support/clinical-fixtures';
import { FIXTURE_STANDARDS, addCycle, addStandard, auditBody, createAudit, defaultScheduleId, scheduleBody } from '../../api/support/audit-fixtures';
import { ApiClient } from '../../api/support/test-app';
import { RawClient, credentialsOf, type Credentials } from './raw-client';

/** Who sends a fuzz request. */
export type Actor = Role | 'anonymous';

/** Ids and versions of the records the write routes aim at (nothing the fuzz sends may change them). */
export interface FixtureIds {
  users: Record<Role | 'other', number>;
  patient: { id: number; version: number; code: string };
  case: { id: number; version: number };
  site: { id: number; version: number };
  visit: { id: number; version: number };
  complication: { id: number; version: number };
  defaultSchedule: number;
  /** A schedule an audit uses (so it cannot be deleted either). */
  schedule: { id: number; version: number };
  audit: { id: number; version: number };
  standard: StandardView;
  cycle: { id: number; version: number };
  action: { id: number; version: number };
  /** A message already sent (a retry answers 409). */
  sentMessage: number;
}

/** One app with every role signed in, the fixture records and a raw client on a real port. */
export interface FuzzWorld {
  world: ClinicalWorld;
  raw: RawClient;
  ids: FixtureIds;
  credentials(actor: Actor): Credentials;
  /** A new anonymous session (cookie + CSRF token), for routes that end the session they are sent with. */
  freshAnonymous(): Promise<Credentials>;
  close(): Promise<void>;
}

const SIGN_IN_LIMITS = { perAccount: 1_000_000_000, perAddress: 1_000_000_000, windowMs: 60_000 };

async function clinicalRecords(w: ClinicalWorld): Promise<Pick<FixtureIds, 'patient' | 'case' | 'site' | 'visit' | 'complication'>> {
  const lead = w.as('audit_lead');
  const created = await createCase(lead, w.ids.clinician, caseBody(w.ids.clinician));
  const siteId = created.sites[0].id;
  expectStatus(await lead.post(`/api/cases/${created.id}/visits`, visitBody([{ siteId, refGm: 9.5 }])), 201);
  expectStatus(await lead.post(`/api/cases/${created.id}/complications`, { type: 'delayed-healing', grade: 'I', onsetDate: created.surgeryDate }), 201);
  const detail = expectStatus(await lead.get(`/api/cases/${created.id}`), 200).body as CaseDetail;
  return {
    patient: { id: detail.patient.id, version: detail.patient.version, code: detail.patient.code },
    case: { id: detail.id, version: detail.version },
    site: { id: detail.sites[0].id, version: detail.sites[0].version },
    visit: { id: detail.visits[0].id, version: detail.visits[0].version },
    complication: { id: detail.complications[0].id, version: detail.complications[0].version },
  };
}

async function auditRecords(w: ClinicalWorld): Promise<Pick<FixtureIds, 'defaultSchedule' | 'schedule' | 'audit' | 'standard' | 'cycle' | 'action' | 'sentMessage'>> {
  const lead = w.as('audit_lead');
  const schedule = expectStatus(await lead.post('/api/schedules', scheduleBody({ name: 'Fuzz schedule' })), 201).body as ScheduleView;
  const audit: AuditView = await createAudit(lead, auditBody(schedule.id));
  const standard = await addStandard(lead, audit.id, FIXTURE_STANDARDS[0]);
  const cycle: CycleView = await addCycle(lead, audit.id, '2024-01-01', '2024-12-31');
  const action = expectStatus(await lead.post(`/api/cycles/${cycle.id}/actions`, { action: 'Recalibrate probes', ownerId: w.ids.audit_lead, dueDate: '2024-12-31' }), 201).body as { id: number; version: number };
  expectStatus(await lead.post(`/api/audits/${audit.id}/send-pack`, {}), 202);
  const outbox = expectStatus(await w.as('admin').get('/api/outbox'), 200).body as OutboxEntry[];
  const sent = outbox.find((entry) => entry.status === 'sent');
  if (!sent) throw new Error('The governance pack message was not sent.');
  const fresh = expectStatus(await lead.get(`/api/audits/${audit.id}`), 200).body as AuditView;
  return {
    defaultSchedule: await defaultScheduleId(lead),
    schedule: { id: schedule.id, version: schedule.version },
    audit: { id: fresh.id, version: fresh.version },
    standard,
    cycle: { id: cycle.id, version: cycle.version },
    action: { id: action.id, version: action.version },
    sentMessage: sent.id,
  };
}

/** Builds one world (one app, one database) for a group of routes. */
export async function createFuzzWorld(): Promise<FuzzWorld> {
  const world = await createClinicalWorld({ loginLimits: SIGN_IN_LIMITS });
  const ids: FixtureIds = { users: world.ids, ...(await clinicalRecords(world)), ...(await auditRecords(world)) };
  const raw = await RawClient.listen(world.t.app);
  const anonymous = new ApiClient(world.t.app);
  await anonymous.get('/api/auth/me');
  const credentials = (actor: Actor): Credentials => credentialsOf(actor === 'anonymous' ? anonymous : world.as(actor));
  return {
    world,
    raw,
    ids,
    credentials,
    async freshAnonymous() {
      const client = new ApiClient(world.t.app);
      await client.get('/api/auth/me');
      return credentialsOf(client);
    },
    async close() {
      await raw.close();
      await world.close();
    },
  };
}
