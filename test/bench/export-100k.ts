/**
 * Benchmark: the governance workbook for 100,000 site-visit rows against exceljs' bare
 * streaming writer writing the same rows.
 *
 * A synthetic audit dataset (seeded PRNG; invented numbers, not clinical data) of 100,000
 * site-visit rows is built in memory. Then, alternating, several runs each:
 *  (a) floor — `new ExcelJS.stream.xlsx.WorkbookWriter({ filename })` with its defaults, one
 *      sheet, the same Site data cell values (same generator and column mapping), one
 *      `addRow(...).commit()` per row;
 *  (b) pipeline — the whole export: composeGovernancePack (headline results, five subgroup
 *      views, funnel, site rows, all through analytics/) and writeGovernanceWorkbook (ten
 *      sheets with styles and number formats, three charts, the streaming re-zip that adds the
 *      pictures).
 * Each run is its own child process (this file with `--run floor|pipeline <n>`), so the two never
 * share a heap and each peak RSS is that run's alone; the dataset is built before the clock starts.
 * Prints one bench line (support/bench-line.ts): value = pipeline ms, floor = floor ms (medians),
 * ratio, peakRssMb (the highest pipeline run's). Goal: ratio ≤ 2 and peak RSS < 300 MB.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { performance } from 'node:perf_hooks';
import ExcelJS from 'exceljs';
import type { AuditCaseRecord, AuditDataset, ClavienDindoGrade, Indication, OutcomeRecord, Phenotype, Procedure, SiteLocation, SmokingStatus, StandardView } from '../../shared/index';
import { DEFAULT_RECALL_SCHEDULE } from '../../shared/types/recall-schedule';
import { composeGovernancePack } from '../../server/export/compose-governance-pack';
import { writeGovernanceWorkbook } from '../../server/export/governance-workbook';
import { SITE_DATA_COLUMNS } from '../../server/export/site-data-sheet';
import type { AuditSnapshot } from '../../server/services/audit-cycle.service';
import { printBenchLine, ratioOf } from './support/bench-line';
import { median } from './support/median';
import { mulberry32 } from './support/mulberry32';
import { peakRssMb } from './support/peak-rss';

const ROWS = 100_000;
const RUNS = 5;
const GOAL_RATIO = 2;
const RSS_LIMIT_MB = 300;
const AS_OF = '2025-06-30';

const random = mulberry32(20_250_301);
const pick = <T>(items: readonly T[]): T => items[Math.floor(random() * items.length)];
const halfMm = (value: number): number => Math.round(Math.min(20, Math.max(0, value)) * 2) / 2;
const DAY_MS = 86_400_000;
const isoDate = (day: number): string => new Date(day * DAY_MS).toISOString().slice(0, 10);

/** A cohort of cases with 1–4 sites seen at every interval of the default schedule, until ROWS rows. */
function syntheticDataset(): AuditDataset {
  const records: OutcomeRecord[] = [];
  const cases: AuditCaseRecord[] = [];
  const firstDay = Date.UTC(2022, 0, 1) / DAY_MS;
  const teeth = [11, 12, 13, 14, 21, 22, 23, 24, 31, 32, 41, 42];
  const locations: SiteLocation[] = ['mid-facial', 'mid-facial', 'mesial-papilla', 'distal-papilla'];
  const procedures: Procedure[] = ['gingivectomy', 'apically-positioned-flap', 'apf-osseous-recontouring'];
  const indications: Indication[] = ['aesthetic', 'restorative-caries', 'restorative-fracture', 'restorative-ferrule'];
  const grades: ClavienDindoGrade[] = ['I', 'I', 'II', 'IIIa'];
  let siteId = 0;
  let caseId = 0;
  let patientId = 0;
  while (records.length < ROWS) {
    caseId += 1;
    if (caseId === 1 || random() < 0.8) patientId += 1;
    const surgeryDay = firstDay + Math.floor(random() * 900);
    const surgeryDate = isoDate(surgeryDay);
    const phenotype: Phenotype = pick(['thin', 'thick']);
    const smoking: SmokingStatus = pick(['never', 'never', 'former', 'current']);
    const procedure = pick(procedures);
    const indication = pick(indications);
    const operatorId = 1 + Math.floor(random() * 4);
    const sites = Array.from({ length: 1 + Math.floor(random() * 4) }, () => {
      siteId += 1;
      const baseline = halfMm(6 + random() * 4);
      return { id: siteId, tooth: pick(teeth), location: pick(locations), baseline, postOp: halfMm(baseline + 1 + random() * 2.5), papilla: Math.floor(random() * 5) };
    });
    const visits = DEFAULT_RECALL_SCHEDULE.map((interval, index) => {
      const visitDate = isoDate(surgeryDay + interval.targetDays + Math.round((random() - 0.4) * 10));
      for (const site of sites) {
        if (records.length >= ROWS) break;
        records.push({
          caseId, patientId, operatorId, phenotype, procedure, indication, smoking, surgeryDate,
          siteId: site.id, tooth: site.tooth, location: site.location, baselineRefGm: site.baseline, postOpRefGm: site.postOp, baselinePapilla: site.papilla,
          intervalKey: interval.key, visitDate, recallRefGm: halfMm(site.postOp - 0.2 * (index + 1) + (random() - 0.5)), recallPapilla: Math.min(4, site.papilla + Math.round(random())), bleedingOnProbing: random() < 0.2,
        });
      }
      return { intervalKey: interval.key, visitDate };
    });
    cases.push({
      caseId, patientId, operatorId, surgeryDate, isWithdrawn: random() < 0.02,
      complications: random() < 0.06 ? [{ type: pick(['bleeding', 'infection', 'delayed-healing']), grade: pick(grades) }] : [],
      visits, procedure, indication, phenotype, smoking, diabetes: 'none', bleedingScorePct: Math.round(random() * 30), finalImpressionDate: isoDate(surgeryDay + 40 + Math.floor(random() * 60)),
      painByInterval: { '2w': Math.floor(random() * 9) },
    });
  }
  return { asOf: AS_OF, schedule: DEFAULT_RECALL_SCHEDULE, thresholds: { stable: 0.5, relapse: 1 }, records, cases };
}

function standard(position: number, fields: Partial<StandardView> & Pick<StandardView, 'criterion' | 'metric' | 'comparator' | 'target'>): StandardView {
  return { id: position, auditId: 1, position, intervalKey: null, thresholdMm: null, thresholdPct: null, minGrade: null, evidenceSource: '', exceptions: '', version: 1, ...fields };
}

const STANDARDS: StandardView[] = [
  standard(1, { criterion: 'Mean rebound at 6 months within 1 mm', metric: 'mean-rebound', intervalKey: '6m', comparator: '<=', target: 1, evidenceSource: 'Arora et al. 2013' }),
  standard(2, { criterion: 'Sites within 1 mm at 6 months', metric: 'share-sites-rebound-within', intervalKey: '6m', thresholdMm: 1, comparator: '>=', target: 80 }),
  standard(3, { criterion: 'Grade II or worse complications', metric: 'share-cases-complication-grade', minGrade: 'II', comparator: '<=', target: 5 }),
  standard(4, { criterion: 'Six-month recall attended', metric: 'recall-completion', intervalKey: '6m', comparator: '>=', target: 85 }),
];

/** One timed run in this process: prints { ms, rows, bytes, peakRssMb }. */
async function runOnce(kind: 'floor' | 'pipeline', file: string): Promise<void> {
  const snapshot: AuditSnapshot = { dataset: syntheticDataset(), standards: STANDARDS, calibrationPairs: [] };
  const compose = () =>
    composeGovernancePack(snapshot, {
      origin: { auditId: 1, cycleId: null, frozenAt: null },
      scope: { kind: 'live' },
      auditTitle: 'Benchmark audit',
      rationale: '',
      leadName: 'Benchmark lead',
      reauditDate: null,
      cohort: { surgeryFrom: null, surgeryTo: null, procedures: [], operatorIds: [], phenotypes: [], indications: [], smoking: [], diabetes: [], regions: [], teeth: [] },
      actions: [],
      producedOn: AS_OF,
      producedBy: 'Audit lead',
      redact: (text) => text,
    });
  const start = performance.now();
  let rows = 0;
  if (kind === 'floor') {
    const workbook = new ExcelJS.stream.xlsx.WorkbookWriter({ filename: file });
    const sheet = workbook.addWorksheet('Site data');
    for (const row of compose().siteData.rows()) {
      sheet.addRow(SITE_DATA_COLUMNS.map((column) => column.value(row))).commit();
      rows += 1;
    }
    sheet.commit();
    await workbook.commit();
  } else {
    const pack = compose();
    await writeGovernanceWorkbook(pack, { stagePath: `${file}.stage`, targetPath: file });
    rows = pack.siteData.count;
  }
  const ms = performance.now() - start;
  console.log(JSON.stringify({ ms, rows, bytes: statSync(file).size, peakRssMb: peakRssMb() }));
}

interface RunResult {
  ms: number;
  rows: number;
  bytes: number;
  peakRssMb: number;
}

function spawnRun(kind: 'floor' | 'pipeline', file: string): RunResult {
  const output = execFileSync(process.execPath, [...process.execArgv, fileURLToPath(import.meta.url), '--run', kind, file], { encoding: 'utf8', maxBuffer: 1024 * 1024 });
  const result: RunResult = JSON.parse(output.trim().split('\n').pop() ?? '{}');
  if (result.rows !== ROWS) throw new Error(`${kind} wrote ${result.rows} rows, expected ${ROWS}`);
  return result;
}

async function main(): Promise<void> {
  const directory = mkdtempSync(join(tmpdir(), 'tidemark-export-bench-'));
  try {
    const floors: RunResult[] = [];
    const pipelines: RunResult[] = [];
    // Alternate, so that drift (other load, CPU frequency) falls on both alike.
    for (let run = 0; run < RUNS; run++) {
      const floor = spawnRun('floor', join(directory, `floor-${run}.xlsx`));
      const pipeline = spawnRun('pipeline', join(directory, `pipeline-${run}.xlsx`));
      floors.push(floor);
      pipelines.push(pipeline);
      console.error(`run ${run}: floor ${Math.round(floor.ms)} ms, ${floor.bytes} bytes, ${floor.peakRssMb} MB; pipeline ${Math.round(pipeline.ms)} ms, ${pipeline.bytes} bytes, ${pipeline.peakRssMb} MB`);
    }
    const value = median(pipelines.map((result) => result.ms));
    const floorMedian = median(floors.map((result) => result.ms));
    const ratio = ratioOf(value, floorMedian);
    const peakRss = Math.max(...pipelines.map((result) => result.peakRssMb));
    printBenchLine({
      name: 'export-100k',
      value: Math.round(value),
      floor: Math.round(floorMedian),
      ratio,
      goal: GOAL_RATIO,
      unit: 'ms',
      met: ratio !== null && ratio <= GOAL_RATIO && peakRss < RSS_LIMIT_MB,
      criteria: 'ratio <= 2 and peak RSS < 300 MB',
      rows: ROWS,
      peakRssMb: peakRss,
      floorPeakRssMb: Math.max(...floors.map((result) => result.peakRssMb)),
    });
  } finally {
    rmSync(directory, { recursive: true, force: true });
  }
}

const runAt = process.argv.indexOf('--run');
if (runAt >= 0) {
  const kind = process.argv[runAt + 1];
  if (kind !== 'floor' && kind !== 'pipeline') throw new Error(`--run floor|pipeline, got ${kind}`);
  await runOnce(kind, process.argv[runAt + 2]);
} else {
  await main();
}
