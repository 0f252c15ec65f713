/**
 * Benchmark: the cohort summary against the cost of merely reading its rows.
 *
 * Builds a synthetic cohort (seeded PRNG) of 100,000 sites × 5 recall visits in a
 * temporary SQLite database, then times, in this one process and several runs each:
 *  (a) floor — one plain better-sqlite3 query reading the 500,000 site-visit rows
 *      (streamed with `iterate()`, each row materialised as an object and touched);
 *  (b) pipeline — the same query and statement, each row mapped to an OutcomeRecord and
 *      streamed into summariseOutcomes (which also computes recall completion and
 *      complications from the case-level inputs). Those inputs come from three other
 *      queries (cases, visits, complications); they are read once before timing, like
 *      the floor they are data access rather than analytics, and their read time is
 *      printed to stderr for reference.
 * Prints one bench line (support/bench-line.ts): value = pipeline ms, floor = floor ms (medians),
 * ratio, rows, peakRssMb. Goal: ratio ≤ 1.5 and peak RSS ≤ 500 MB.
 */
import Database from 'better-sqlite3';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { summariseOutcomes } from '../../analytics/summarise-outcomes';
import type {
  CaseOutcome,
  ClavienDindoGrade,
  OutcomeRecord,
  Phenotype,
  SiteLocation,
  SmokingStatus,
} from '../../shared/types/outcome-record';
import { DEFAULT_RECALL_SCHEDULE } from '../../shared/types/recall-schedule';
import { printBenchLine, ratioOf } from './support/bench-line';
import { median } from './support/median';
import { mulberry32 } from './support/mulberry32';
import { peakRssMb } from './support/peak-rss';

const SITES = 100_000;
const RUNS = 7;
const SEED = 20_240_901;
const AS_OF = '2025-06-30';
const GOAL_RATIO = 1.5;
const RSS_LIMIT_MB = 500;

const random = mulberry32(SEED);
const pick = <T>(items: readonly T[]): T => items[Math.floor(random() * items.length)];
const halfMm = (value: number): number => Math.round(Math.min(20, Math.max(0, value)) * 2) / 2;
const DAY_MS = 86_400_000;
const isoDate = (day: number): string => new Date(day * DAY_MS).toISOString().slice(0, 10);

const SCHEMA = `
  CREATE TABLE cases (case_id INTEGER PRIMARY KEY, patient_id INTEGER NOT NULL, operator_id INTEGER NOT NULL,
    phenotype TEXT, procedure TEXT NOT NULL, indication TEXT NOT NULL, smoking TEXT, surgery_date TEXT NOT NULL,
    is_withdrawn INTEGER NOT NULL);
  CREATE TABLE sites (site_id INTEGER PRIMARY KEY, case_id INTEGER NOT NULL REFERENCES cases, tooth INTEGER NOT NULL,
    location TEXT NOT NULL, baseline_ref_gm REAL NOT NULL, post_op_ref_gm REAL, baseline_papilla INTEGER);
  CREATE TABLE visits (visit_id INTEGER PRIMARY KEY, case_id INTEGER NOT NULL REFERENCES cases,
    interval_key TEXT NOT NULL, visit_date TEXT NOT NULL);
  CREATE TABLE site_measurements (visit_id INTEGER NOT NULL REFERENCES visits, site_id INTEGER NOT NULL REFERENCES sites,
    recall_ref_gm REAL, recall_papilla INTEGER, bleeding_on_probing INTEGER, PRIMARY KEY (visit_id, site_id));
  CREATE TABLE complications (case_id INTEGER NOT NULL REFERENCES cases, type TEXT NOT NULL, grade TEXT NOT NULL);
  CREATE INDEX sites_case_id ON sites (case_id);
  CREATE INDEX visits_case_id ON visits (case_id);
  CREATE INDEX complications_case_id ON complications (case_id);
`;

/** Fills the database: about 3 sites per case, every case seen at all 5 intervals. */
function seedCohort(db: Database.Database): void {
  db.exec(SCHEMA);
  const insertCase = db.prepare('INSERT INTO cases VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)');
  const insertSite = db.prepare('INSERT INTO sites VALUES (?, ?, ?, ?, ?, ?, ?)');
  const insertVisit = db.prepare('INSERT INTO visits VALUES (?, ?, ?, ?)');
  const insertMeasurement = db.prepare('INSERT INTO site_measurements VALUES (?, ?, ?, ?, ?)');
  const insertComplication = db.prepare('INSERT INTO complications VALUES (?, ?, ?)');
  const firstSurgeryDay = Date.UTC(2023, 0, 1) / DAY_MS;
  const teeth = [11, 12, 13, 14, 21, 22, 23, 24, 31, 32, 41, 42];
  const grades: ClavienDindoGrade[] = ['I', 'I', 'I', 'II', 'II', 'IIIa'];
  const locations: SiteLocation[] = ['mid-facial', 'mid-facial', 'mesial-papilla', 'distal-papilla'];
  // Rebound grows over the intervals, more for a thick phenotype (synthetic, not clinical data).
  const reboundByInterval = [0.1, 0.3, 0.5, 0.7, 0.9];

  db.transaction(() => {
    let siteId = 0;
    let visitId = 0;
    let caseId = 0;
    let patientId = 0;
    while (siteId < SITES) {
      caseId++;
      if (caseId === 1 || random() < 0.8) patientId++;
      const phenotype: Phenotype | null = random() < 0.05 ? null : pick(['thin', 'thick']);
      const surgeryDay = firstSurgeryDay + Math.floor(random() * 540);
      insertCase.run(
        caseId, patientId, 1 + Math.floor(random() * 4), phenotype,
        pick(['gingivectomy', 'apically positioned flap', 'apically positioned flap with osseous recontouring']),
        pick(['aesthetic', 'restorative access', 'subgingival caries']),
        pick<SmokingStatus | null>(['never', 'never', 'former', 'current', null]), isoDate(surgeryDay), random() < 0.02 ? 1 : 0,
      );
      if (random() < 0.06) insertComplication.run(caseId, pick(['bleeding', 'delayed healing', 'infection', 'pain beyond expected']), pick(grades));

      const siteCount = Math.min(SITES - siteId, 1 + Math.floor(random() * 5));
      const caseSites: { id: number; baseline: number; postOp: number | null; papilla: number | null }[] = [];
      for (let s = 0; s < siteCount; s++) {
        siteId++;
        const location = pick(locations);
        const baseline = halfMm(6 + random() * 4);
        const postOp = random() < 0.01 ? null : halfMm(baseline + 1 + random() * 2.5);
        const papilla = location === 'mid-facial' ? null : Math.floor(random() * 5);
        insertSite.run(siteId, caseId, pick(teeth), location, baseline, postOp, papilla);
        caseSites.push({ id: siteId, baseline, postOp, papilla });
      }
      DEFAULT_RECALL_SCHEDULE.forEach((interval, k) => {
        visitId++;
        const jitter = Math.round((random() - 0.3) * (interval.windowAfterDays + interval.windowBeforeDays));
        insertVisit.run(visitId, caseId, interval.key, isoDate(surgeryDay + interval.targetDays + jitter));
        const drift = reboundByInterval[k] * (phenotype === 'thick' ? 1.3 : 0.8);
        for (const site of caseSites) {
          const recall = site.postOp === null || random() < 0.03 ? null : halfMm(site.postOp - drift + (random() - 0.5) * 1.5);
          const papilla = site.papilla === null ? null : Math.min(4, Math.max(0, site.papilla + Math.round(random() * 2 - 1)));
          insertMeasurement.run(visitId, site.id, recall, papilla, random() < 0.1 ? null : random() < 0.2 ? 1 : 0);
        }
      });
    }
  })();
}

const RECORD_SQL = `
  SELECT c.case_id, c.patient_id, c.operator_id, c.phenotype, c.procedure, c.indication, c.smoking, c.surgery_date,
         s.site_id, s.tooth, s.location, s.baseline_ref_gm, s.post_op_ref_gm, s.baseline_papilla,
         v.interval_key, v.visit_date, m.recall_ref_gm, m.recall_papilla, m.bleeding_on_probing
  FROM site_measurements m
  JOIN visits v ON v.visit_id = m.visit_id
  JOIN sites s ON s.site_id = m.site_id
  JOIN cases c ON c.case_id = s.case_id`;

/** A row of RECORD_SQL as SQLite returns it. */
interface RecordRow {
  case_id: number;
  patient_id: number;
  operator_id: number;
  phenotype: string | null;
  procedure: string;
  indication: string;
  smoking: string | null;
  surgery_date: string;
  site_id: number;
  tooth: number;
  location: string;
  baseline_ref_gm: number;
  post_op_ref_gm: number | null;
  baseline_papilla: number | null;
  interval_key: string;
  visit_date: string;
  recall_ref_gm: number | null;
  recall_papilla: number | null;
  bleeding_on_probing: number | null;
}

function toPhenotype(value: string | null): Phenotype | null {
  return value === 'thin' || value === 'thick' ? value : null;
}

function toSmoking(value: string | null): SmokingStatus | null {
  return value === 'never' || value === 'former' || value === 'current' ? value : null;
}

function toLocation(value: string): SiteLocation {
  return value === 'mesial-papilla' || value === 'distal-papilla' ? value : 'mid-facial';
}

/** Maps a database row to the shared record type (what the server's mapper does). */
function toOutcomeRecord(row: RecordRow): OutcomeRecord {
  return {
    caseId: row.case_id,
    patientId: row.patient_id,
    operatorId: row.operator_id,
    phenotype: toPhenotype(row.phenotype),
    procedure: row.procedure,
    indication: row.indication,
    smoking: toSmoking(row.smoking),
    surgeryDate: row.surgery_date,
    siteId: row.site_id,
    tooth: row.tooth,
    location: toLocation(row.location),
    baselineRefGm: row.baseline_ref_gm,
    postOpRefGm: row.post_op_ref_gm,
    baselinePapilla: row.baseline_papilla,
    intervalKey: row.interval_key,
    visitDate: row.visit_date,
    recallRefGm: row.recall_ref_gm,
    recallPapilla: row.recall_papilla,
    bleedingOnProbing: row.bleeding_on_probing === null ? null : row.bleeding_on_probing !== 0,
  };
}

/**
 * Maps rows lazily, so each record lives only as long as summariseOutcomes looks at it.
 * A plain iterator rather than a generator: resuming a generator 500,000 times costs
 * about as much again as the mapping itself.
 */
function toOutcomeRecords(rows: IterableIterator<RecordRow>): Iterable<OutcomeRecord> {
  return {
    [Symbol.iterator]: () => ({
      next: (): IteratorResult<OutcomeRecord> => {
        const row = rows.next();
        return row.done ? { done: true, value: undefined } : { done: false, value: toOutcomeRecord(row.value) };
      },
    }),
  };
}

const GRADES: readonly ClavienDindoGrade[] = ['I', 'II', 'IIIa', 'IIIb', 'IVa', 'IVb', 'V'];

function toGrade(value: string): ClavienDindoGrade {
  const grade = GRADES.find((candidate) => candidate === value);
  if (grade === undefined) throw new Error(`unknown Clavien–Dindo grade ${value}`);
  return grade;
}

/** Case-level inputs: three queries in case order, merged in one pass into CaseOutcome objects. */
function readCases(db: Database.Database): CaseOutcome[] {
  const cases = db
    .prepare<[], { case_id: number; patient_id: number; operator_id: number; surgery_date: string; is_withdrawn: number }>(
      'SELECT case_id, patient_id, operator_id, surgery_date, is_withdrawn FROM cases ORDER BY case_id',
    )
    .all();
  const visits = db
    .prepare<[], { case_id: number; interval_key: string; visit_date: string }>(
      'SELECT case_id, interval_key, visit_date FROM visits ORDER BY case_id',
    )
    .iterate();
  const complications = db
    .prepare<[], { case_id: number; type: string; grade: string }>('SELECT case_id, type, grade FROM complications ORDER BY case_id')
    .iterate();
  let visit = visits.next();
  let complication = complications.next();
  const outcomes = cases.map((row) => {
    const caseVisits: { intervalKey: string; visitDate: string }[] = [];
    for (; !visit.done && visit.value.case_id <= row.case_id; visit = visits.next()) {
      if (visit.value.case_id === row.case_id) {
        caseVisits.push({ intervalKey: visit.value.interval_key, visitDate: visit.value.visit_date });
      }
    }
    const caseComplications: { type: string; grade: ClavienDindoGrade }[] = [];
    for (; !complication.done && complication.value.case_id <= row.case_id; complication = complications.next()) {
      if (complication.value.case_id === row.case_id) {
        caseComplications.push({ type: complication.value.type, grade: toGrade(complication.value.grade) });
      }
    }
    return {
      caseId: row.case_id,
      patientId: row.patient_id,
      operatorId: row.operator_id,
      surgeryDate: row.surgery_date,
      isWithdrawn: row.is_withdrawn !== 0,
      complications: caseComplications,
      visits: caseVisits,
    };
  });
  // Release the cursors should a row reference a case the cases query did not return.
  visits.return?.();
  complications.return?.();
  return outcomes;
}

function time(task: () => number): { ms: number; rows: number } {
  const start = performance.now();
  const rows = task();
  return { ms: performance.now() - start, rows };
}

function main(): void {
  const directory = mkdtempSync(join(tmpdir(), 'tidemark-bench-'));
  const db = new Database(join(directory, 'cohort.sqlite'));
  try {
    db.pragma('journal_mode = WAL');
    seedCohort(db);
    const statement = db.prepare<[], RecordRow>(RECORD_SQL);

    // Both stream the rows: `.all()` alone would hold 500,000 row objects (≈ 400 MB).
    const floor = (): number => {
      let rows = 0;
      for (const row of statement.iterate()) if (row.site_id > 0) rows++;
      return rows;
    };
    const caseRead = time(() => readCases(db).length);
    const cases = readCases(db);
    const pipeline = (): number => {
      const summary = summariseOutcomes(toOutcomeRecords(statement.iterate()), {
        cases,
        schedule: DEFAULT_RECALL_SCHEDULE,
        asOf: AS_OF,
      });
      return summary.nRecords;
    };

    // One untimed run of each warms the JIT and SQLite's page cache.
    floor();
    pipeline();
    const floorMs: number[] = [];
    const pipelineMs: number[] = [];
    let rows = 0;
    // Alternate the two so that drift (GC, CPU frequency) falls on both alike.
    for (let run = 0; run < RUNS; run++) {
      const a = time(floor);
      const b = time(pipeline);
      if (a.rows !== b.rows) throw new Error(`row counts differ: floor ${a.rows}, pipeline ${b.rows}`);
      rows = a.rows;
      floorMs.push(a.ms);
      pipelineMs.push(b.ms);
    }
    const floorMedian = median(floorMs);
    const pipelineMedian = median(pipelineMs);
    const ratio = ratioOf(pipelineMedian, floorMedian);
    const peakRss = peakRssMb();
    printBenchLine({
      name: 'analytics-summary',
      value: Math.round(pipelineMedian),
      floor: Math.round(floorMedian),
      ratio,
      goal: GOAL_RATIO,
      unit: 'ms',
      met: ratio !== null && ratio <= GOAL_RATIO && peakRss <= RSS_LIMIT_MB,
      criteria: 'ratio <= 1.5 and peak RSS <= 500 MB',
      rows,
      peakRssMb: peakRss,
    });
    console.error(`case-level inputs: ${caseRead.rows} cases read in ${Math.round(caseRead.ms)} ms (untimed)`);
  } finally {
    db.close();
    rmSync(directory, { recursive: true, force: true });
  }
}

main();
