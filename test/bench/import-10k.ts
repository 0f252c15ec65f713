/**
 * Benchmark: the historical import of 10,000 rows against a bare better-sqlite3 insert of the
 * same records.
 *
 * A synthetic file (invented numbers, not clinical data) of 10,000 rows — 400 cases by 320
 * patients, 5 sites each, seen at the 5 intervals of the default schedule — is made once as CSV
 * and once as plain records. Each run works on a fresh copy of a migrated database (SQLite online
 * backup, untimed) and times, alternating:
 *  (a) floor — one better-sqlite3 transaction inserting the 320 patients, 400 cases, 2,000 sites,
 *      2,000 visits and 10,000 measurements with prepared statements, no checks;
 *  (b) pipeline — ImportService.importFile on the CSV bytes: content sniffing, CSV parsing, the
 *      shared zod row schema on every row, the file-wide consistency checks, the database checks
 *      and the same inserts in one transaction.
 * Prints one bench line (support/bench-line.ts): value = pipeline ms, floor = floor ms (medians of
 * the timed runs), ratio, peakRssMb. Goal: ratio ≤ 4 (and "seconds" for 10,000 rows).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import Database from 'better-sqlite3';
import { IMPORT_COLUMNS, type ImportColumn } from '../../shared/index';
import { DEFAULT_RECALL_SCHEDULE } from '../../shared/types/recall-schedule';
import { openDatabase } from '../../server/data-source';
import { ImportService } from '../../server/import/import.service';
import { sqliteConnection } from '../../server/import/sqlite-connection';
import { ScheduleService } from '../../server/services/schedule.service';
import { printBenchLine, ratioOf } from './support/bench-line';
import { median } from './support/median';
import { peakRssMb } from './support/peak-rss';

const CASES = 400;
const TEETH = [11, 12, 13, 21, 22];
const RUNS = 5;
const GOAL_RATIO = 4;
const OPERATOR = { email: 'bench.operator@example.org', displayName: 'Bench operator', role: 'audit_lead' as const };

/** One case of the synthetic file. */
interface BenchCase {
  code: string;
  birthYear: number;
  surgeryDate: string;
  sites: { tooth: number; baseline: number; postOp: number }[];
  visits: { key: string; date: string; readings: number[] }[];
}

const DAY_MS = 86_400_000;
const iso = (time: number): string => new Date(time).toISOString().slice(0, 10);

function benchCases(): BenchCase[] {
  return Array.from({ length: CASES }, (_, index) => {
    const surgery = Date.UTC(2021, 0, 4) + index * 2 * DAY_MS;
    const sites = TEETH.map((tooth, position) => ({ tooth, baseline: 7 + (position % 3) * 0.5, postOp: 9 + (position % 2) * 0.5 }));
    return {
      // Every fifth patient has two cases (320 patients for 400 cases).
      code: `BN-${String(Math.floor(index * 0.8)).padStart(5, '0')}`,
      birthYear: 1950 + (Math.floor(index * 0.8) % 50),
      surgeryDate: iso(surgery),
      sites,
      visits: DEFAULT_RECALL_SCHEDULE.map((interval, k) => ({ key: interval.key, date: iso(surgery + interval.targetDays * DAY_MS), readings: sites.map((site) => site.postOp - 0.5 * (k % 2)) })),
    };
  });
}

function csvOf(cases: readonly BenchCase[]): Buffer {
  const lines = [IMPORT_COLUMNS.join(',')];
  for (const found of cases) {
    found.visits.forEach((visit) => {
      found.sites.forEach((site, position) => {
        const row: Record<ImportColumn, string | number> = {
          patient_code: found.code, birth_year: found.birthYear, sex: 'female', smoking: 'never', cigarettes_per_day: '', diabetes: 'none', phenotype: 'thin',
          phenotype_method: 'visual', operator_email: OPERATOR.email, surgery_date: found.surgeryDate, procedure: 'gingivectomy', indication: 'aesthetic',
          instrument: 'scalpel', tooth: site.tooth, site_location: 'mid-facial', reference_point: 'incisal-edge', baseline_ref_gm: site.baseline,
          post_op_ref_gm: site.postOp, kt_width: 5, margin_to_crest: 4, baseline_papilla: '', interval_key: visit.key, visit_date: visit.date,
          recall_ref_gm: visit.readings[position], recall_papilla: '', bleeding_on_probing: 'no', pain: 1,
        };
        lines.push(IMPORT_COLUMNS.map((column) => row[column]).join(','));
      });
    });
  }
  return Buffer.from(lines.join('\n') + '\n', 'utf8');
}

/** The floor: the same records, straight in, one transaction, no checks. */
function bareInsert(file: string, cases: readonly BenchCase[], operatorId: number): number {
  const db = new Database(file);
  db.pragma('journal_mode = WAL');
  db.pragma('synchronous = FULL');
  db.pragma('foreign_keys = ON');
  const insertPatient = db.prepare('INSERT INTO patient (code, birth_year, sex, smoking, cigarettes_per_day, diabetes, phenotype, phenotype_method, created_by_id, version) VALUES (?, ?, ?, ?, NULL, ?, ?, ?, ?, 1)');
  const insertCase = db.prepare('INSERT INTO surgical_case (patient_id, operator_id, surgery_date, procedure, indication, instrument, hygiene_phase_complete, status, created_by_id, version) VALUES (?, ?, ?, ?, ?, ?, 0, ?, ?, 1)');
  const insertSite = db.prepare('INSERT INTO site (case_id, tooth, location, reference_point, baseline_ref_gm, kt_width, margin_to_crest, papilla_score, post_op_ref_gm, version) VALUES (?, ?, ?, ?, ?, ?, ?, NULL, ?, 1)');
  const insertVisit = db.prepare('INSERT INTO visit (case_id, interval_key, visit_date, examiner_id, pain, version) VALUES (?, ?, ?, ?, ?, 1)');
  const insertMeasurement = db.prepare('INSERT INTO site_measurement (visit_id, site_id, ref_gm, bleeding_on_probing, papilla_score) VALUES (?, ?, ?, ?, NULL)');
  let rows = 0;
  db.transaction(() => {
    const patients = new Map<string, number>();
    for (const found of cases) {
      let patientId = patients.get(found.code);
      if (patientId === undefined) {
        patientId = Number(insertPatient.run(found.code, found.birthYear, 'female', 'never', 'none', 'thin', 'visual', operatorId).lastInsertRowid);
        patients.set(found.code, patientId);
      }
      const caseId = Number(insertCase.run(patientId, operatorId, found.surgeryDate, 'gingivectomy', 'aesthetic', 'scalpel', 'in-recall', operatorId).lastInsertRowid);
      const siteIds = found.sites.map((site) => Number(insertSite.run(caseId, site.tooth, 'mid-facial', 'incisal-edge', site.baseline, 5, 4, site.postOp).lastInsertRowid));
      for (const visit of found.visits) {
        const visitId = Number(insertVisit.run(caseId, visit.key, visit.date, operatorId, 1).lastInsertRowid);
        visit.readings.forEach((reading, position) => {
          insertMeasurement.run(visitId, siteIds[position], reading, 0);
          rows += 1;
        });
      }
    }
  })();
  db.close();
  return rows;
}

async function main(): Promise<void> {
  const directory = mkdtempSync(join(tmpdir(), 'tidemark-import-bench-'));
  try {
    const template = join(directory, 'template.sqlite');
    const seed = await openDatabase({ database: template });
    await seed.query(`INSERT INTO "user" (email, display_name, role, active, password_hash) VALUES (?, ?, ?, 1, 'scrypt$bench')`, [OPERATOR.email, OPERATOR.displayName, OPERATOR.role]);
    const [{ id: operatorId }] = (await seed.query('SELECT id FROM "user" WHERE email = ?', [OPERATOR.email])) as { id: number }[];
    const user: Express.User = { id: operatorId, email: OPERATOR.email, displayName: OPERATOR.displayName, role: OPERATOR.role };
    const cases = benchCases();
    const csv = csvOf(cases);
    const floorMs: number[] = [];
    const pipelineMs: number[] = [];
    for (let run = 0; run <= RUNS; run++) {
      const floorFile = join(directory, `floor-${run}.sqlite`);
      const pipelineFile = join(directory, `pipeline-${run}.sqlite`);
      await sqliteConnection(seed).backup(floorFile);
      await sqliteConnection(seed).backup(pipelineFile);

      let start = performance.now();
      const floorRows = bareInsert(floorFile, cases, operatorId);
      const a = performance.now() - start;

      const dataSource = await openDatabase({ database: pipelineFile });
      const service = new ImportService(dataSource, new ScheduleService(dataSource));
      start = performance.now();
      const outcome = await service.importFile(user, csv);
      const b = performance.now() - start;
      await dataSource.destroy();
      if (outcome.state !== 'done') throw new Error(`import ${outcome.state}: ${JSON.stringify(outcome.issues.slice(0, 3))}`);
      if (floorRows !== 10_000 || outcome.counts.cases !== CASES) throw new Error(`unexpected counts: floor ${floorRows} rows, import ${JSON.stringify(outcome.counts)}`);
      // Run 0 warms the JIT and the file cache and is not counted.
      if (run > 0) {
        floorMs.push(a);
        pipelineMs.push(b);
      }
      console.error(`run ${run}: floor ${Math.round(a)} ms, pipeline ${Math.round(b)} ms (${JSON.stringify(outcome.counts)})`);
    }
    await seed.destroy();
    const value = median(pipelineMs);
    const floor = median(floorMs);
    const ratio = ratioOf(value, floor);
    printBenchLine({
      name: 'import-10k',
      value: Math.round(value),
      floor: Math.round(floor),
      ratio,
      goal: GOAL_RATIO,
      unit: 'ms',
      met: ratio !== null && ratio <= GOAL_RATIO,
      criteria: 'ratio <= 4',
      rows: 10_000,
      peakRssMb: peakRssMb(),
    });
  } finally {
    rmSync(directory, { recursive: true, force: true });
  }
}

await main();
