import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { IMPORT_COLUMNS, type ImportColumn } from '@tidemark/shared';
import { createTestApp, demoEmail } from '../api/support/test-app';
import { batchCounts, recallProblems, soundness, withDatabase, type BatchCounts } from './support/database-checks';
import { runUntilKilled } from './support/killed-child';

/*
 * Crash safety: a writer process is killed with SIGKILL in the middle of its work, again and
 * again on the same database, and after every kill the file must open sound (integrity and
 * foreign keys) and show no half-written transaction. SQLite promises this for a process crash
 * in WAL mode (sqlite.org/transactional.html, sqlite.org/wal.html): an uncommitted transaction
 * never reaches the database, and a committed one survives the process.
 */

const ROUNDS = 10;
const PATIENTS_PER_IMPORT = 250;
const IMPORT_TEETH = [11, 21];
const IMPORT_INTERVALS: ReadonlyArray<[key: string, days: number]> = [['2w', 14], ['6w', 42], ['3m', 91], ['6m', 182], ['12m', 365]];
/** One case per patient, one site per tooth, one visit per interval, one row per site per visit. */
const FULL_IMPORT: BatchCounts = {
  patients: PATIENTS_PER_IMPORT,
  cases: PATIENTS_PER_IMPORT,
  sites: PATIENTS_PER_IMPORT * IMPORT_TEETH.length,
  visits: PATIENTS_PER_IMPORT * IMPORT_INTERVALS.length,
  measurements: PATIENTS_PER_IMPORT * IMPORT_TEETH.length * IMPORT_INTERVALS.length,
};
const EMPTY_IMPORT: BatchCounts = { patients: 0, cases: 0, sites: 0, visits: 0, measurements: 0 };
const SITES_PER_RECALL_CASE = 3;

/** A 2,500-row import file in the template's long format; every patient code starts with `prefix-`. */
function importCsv(prefix: string, operatorEmail: string): string {
  const lines = [IMPORT_COLUMNS.join(',')];
  for (let index = 0; index < PATIENTS_PER_IMPORT; index += 1) {
    const surgery = Date.UTC(2022, 0, 3) + (index % 300) * 86_400_000;
    const day = (offset: number): string => new Date(surgery + offset * 86_400_000).toISOString().slice(0, 10);
    for (const tooth of IMPORT_TEETH) {
      for (const [intervalKey, days] of IMPORT_INTERVALS) {
        const row: Record<ImportColumn, string | number> = {
          patient_code: `${prefix}-${String(index).padStart(4, '0')}`,
          birth_year: 1970 + (index % 30),
          sex: index % 2 ? 'female' : 'male',
          smoking: 'never',
          cigarettes_per_day: '',
          diabetes: 'none',
          phenotype: 'thin',
          phenotype_method: 'probe-visibility',
          operator_email: operatorEmail,
          surgery_date: day(0),
          procedure: 'gingivectomy',
          indication: 'aesthetic',
          instrument: 'scalpel',
          tooth,
          site_location: 'mid-facial',
          reference_point: 'incisal-edge',
          baseline_ref_gm: 8,
          post_op_ref_gm: 10,
          kt_width: 5,
          margin_to_crest: 4,
          baseline_papilla: '',
          interval_key: intervalKey,
          visit_date: day(days),
          recall_ref_gm: 9.5,
          recall_papilla: '',
          bleeding_on_probing: 'no',
          pain: 1,
        };
        lines.push(IMPORT_COLUMNS.map((column) => row[column]).join(','));
      }
    }
  }
  return lines.join('\n');
}

describe('crash safety: a writer killed with SIGKILL mid-transaction, round after round', () => {
  let dataDir: string;
  let database: string;
  let scratch: string;

  beforeAll(async () => {
    // A migrated database with the demo accounts, then closed: only the children write to it.
    const t = await createTestApp();
    await t.dataSource.destroy();
    dataDir = t.dataDir;
    database = path.join(dataDir, 'tidemark.sqlite');
    scratch = mkdtempSync(path.join(tmpdir(), 'tidemark-crash-'));
  });

  afterAll(() => {
    rmSync(dataDir, { recursive: true, force: true });
    rmSync(scratch, { recursive: true, force: true });
  });

  it(`a 2,500-row historical import is entirely present or entirely absent after each of ${ROUNDS} kills`, { timeout: 120_000 }, async () => {
    const outcomes: Array<{ prefix: string; delayMs: number; outcome: 'present' | 'absent'; marks: string[] }> = [];
    for (let round = 1; round <= ROUNDS; round += 1) {
      const prefix = `KI${String(round).padStart(2, '0')}`;
      const csv = path.join(scratch, `${prefix}.csv`);
      writeFileSync(csv, importCsv(prefix, demoEmail('clinician')));
      // The first "inside" mark is written from inside the write transaction, ~1,000 rows in, and
      // the remaining ~1,500 rows take ~10 ms here. Odd rounds kill within 5 ms of it (inside the
      // transaction); even rounds anywhere up to 40 ms (inside it, or just after the commit).
      const delayMs = Math.floor(Math.random() * (round % 2 ? 5 : 40));
      const run = await runUntilKilled('test/maintenance/support/import-child.ts', [database, csv, demoEmail('audit_lead')], (mark) => (mark.startsWith('inside ') ? delayMs : null));
      expect(run.signal, run.stderr).toBe('SIGKILL');
      expect(run.marks.some((mark) => mark.startsWith('inside ')), `${run.marks.join(' | ')}\n${run.stderr}`).toBe(true);

      const { checks, counts } = withDatabase(database, (db) => ({ checks: soundness(db), counts: batchCounts(db, prefix) }));
      expect(checks).toEqual({ integrity: 'ok', foreignKeyViolations: [] });
      const outcome = counts.patients === 0 ? 'absent' : 'present';
      expect(counts, `round ${round} (kill ${delayMs} ms after the first mark inside the transaction)`).toEqual(outcome === 'absent' ? EMPTY_IMPORT : FULL_IMPORT);
      // Durability: once the child said it committed, the rows must have survived its death.
      if (run.marks.some((mark) => mark.startsWith('committed '))) expect(outcome).toBe('present');
      outcomes.push({ prefix, delayMs, outcome, marks: run.marks });
    }
    // Later crashes did not disturb what earlier rounds left.
    const final = withDatabase(database, (db) => outcomes.map(({ prefix }) => (batchCounts(db, prefix).patients === 0 ? 'absent' : 'present')));
    expect(final).toEqual(outcomes.map(({ outcome }) => outcome));
    // An absent batch whose child had written a mark from inside the transaction proves the kill
    // interrupted an open transaction (rather than always landing after the commit).
    expect(outcomes.filter(({ outcome }) => outcome === 'absent').length, JSON.stringify(outcomes.map(({ delayMs, outcome }) => ({ delayMs, outcome })))).toBeGreaterThan(0);
  });

  it(`recall saves (a visit with every site measurement) leave no partial visit after each of ${ROUNDS} kills`, { timeout: 120_000 }, async () => {
    let killedInFlight = 0;
    for (let round = 1; round <= ROUNDS; round += 1) {
      const prefix = `KR${String(round).padStart(2, '0')}`;
      // Kill some milliseconds after the n-th recall save began (n = 1…4): inside the visit's
      // transaction, between two saves, or during the next case's registration.
      const visitsBeforeKill = 1 + Math.floor(Math.random() * 4);
      const delayMs = Math.floor(Math.random() * 15);
      let visitsBegun = 0;
      const run = await runUntilKilled('test/maintenance/support/recall-child.ts', [database, demoEmail('clinician'), prefix], (mark) => {
        if (!mark.startsWith('visit-begin ')) return null;
        visitsBegun += 1;
        return visitsBegun === visitsBeforeKill ? delayMs : null;
      });
      expect(run.signal, run.stderr).toBe('SIGKILL');
      expect(visitsBegun, `${run.marks.join(' | ')}\n${run.stderr}`).toBeGreaterThanOrEqual(visitsBeforeKill);
      const last = run.marks.filter((mark) => mark.startsWith('visit-')).at(-1) ?? '';
      if (last.startsWith('visit-begin ')) killedInFlight += 1;

      const report = withDatabase(database, (db) => ({
        checks: soundness(db),
        problems: recallProblems(db, prefix, SITES_PER_RECALL_CASE),
        // Durability: every case and visit the child saw saved is still there.
        lostCases: run.marks
          .filter((mark) => mark.startsWith('case '))
          .map((mark) => Number(mark.split(' ')[1]))
          .filter((id) => db.prepare('SELECT 1 FROM surgical_case WHERE id = ?').get(id) === undefined),
        lostVisits: run.marks
          .filter((mark) => mark.startsWith('visit-end '))
          .map((mark) => Number(mark.split(' ')[3]))
          .filter((id) => db.prepare('SELECT 1 FROM visit WHERE id = ?').get(id) === undefined),
      }));
      expect(report, `round ${round}: killed ${delayMs} ms after recall save ${visitsBeforeKill}; last mark "${last}"`).toEqual({
        checks: { integrity: 'ok', foreignKeyViolations: [] },
        problems: [],
        lostCases: [],
        lostVisits: [],
      });
    }
    // The check means something only if some kills caught a save half-way.
    expect(killedInFlight).toBeGreaterThan(0);
  });

  it('the checks above do see a half-written import or recall (control)', () => {
    withDatabase(database, (db) => {
      const clinicianId = Number(db.prepare<[string], { id: number }>('SELECT id FROM "user" WHERE email = ?').get(demoEmail('clinician'))?.id);
      // Written by hand inside a transaction that is rolled back: a patient with a case of three
      // sites, and a first recall that measured one site only and left the status and log alone.
      db.exec('BEGIN');
      try {
        const patientId = db
          .prepare("INSERT INTO patient (code, birth_year, sex, smoking, diabetes, phenotype, phenotype_method, created_by_id, version) VALUES ('KC-0001', 1980, 'female', 'never', 'none', 'thin', 'probe-visibility', ?, 1)")
          .run(clinicianId).lastInsertRowid;
        const caseId = db
          .prepare("INSERT INTO surgical_case (patient_id, operator_id, surgery_date, procedure, indication, instrument, hygiene_phase_complete, status, created_by_id, version) VALUES (?, ?, '2024-01-10', 'gingivectomy', 'aesthetic', 'scalpel', 1, 'operated', ?, 1)")
          .run(patientId, clinicianId, clinicianId).lastInsertRowid;
        const siteIds = [11, 12, 21].map(
          (tooth) =>
            db.prepare("INSERT INTO site (case_id, tooth, location, reference_point, baseline_ref_gm, post_op_ref_gm, version) VALUES (?, ?, 'mid-facial', 'incisal-edge', 8, 10, 1)").run(caseId, tooth).lastInsertRowid,
        );
        expect(recallProblems(db, 'KC', SITES_PER_RECALL_CASE)).toEqual([]);
        const visitId = db.prepare("INSERT INTO visit (case_id, interval_key, visit_date, examiner_id, version) VALUES (?, '6w', '2024-02-21', ?, 1)").run(caseId, clinicianId).lastInsertRowid;
        db.prepare('INSERT INTO site_measurement (visit_id, site_id, ref_gm) VALUES (?, ?, 9.5)').run(visitId, siteIds[0]);
        expect(recallProblems(db, 'KC', SITES_PER_RECALL_CASE)).toEqual([
          `case ${caseId}: 1 visits but status operated and 0 "in-recall" change records`,
          `visit ${visitId} has 1 measurements for 3 sites (0 of another case)`,
        ]);
        // An import batch missing one visit's measurements is neither whole nor absent.
        const counts = batchCounts(db, 'KC');
        expect([EMPTY_IMPORT, FULL_IMPORT]).not.toContainEqual(counts);
      } finally {
        db.exec('ROLLBACK');
      }
    });
  });
});
