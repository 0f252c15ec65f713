import type {
  CaseOutcome,
  IntervalOutcomeSummary,
  OutcomeRecord,
  OutcomeSummary,
  RecallInterval,
  StabilityThresholds,
} from '../shared/types/outcome-record';
import { AnalyticsInputError } from './analytics-input-error';
import { MAX_PLAUSIBLE_MM } from './assert-millimetres';
import { assertRecallSchedule } from './assert-recall-schedule';
import { LevelledAccumulator } from './levelled-accumulator';
import { proportionEstimate } from './proportion-estimate';
import { DEFAULT_STABILITY_THRESHOLDS, assertStabilityThresholds, stabilityClass } from './stability-class';
import { summariseComplications } from './summarise-complications';
import { summariseRecallCompletion } from './summarise-recall-completion';
import { assertArray } from './assert-array';

/** Options of {@link summariseOutcomes}. */
export interface SummariseOutcomesOptions {
  /** Case-level outcomes for complications and recall completion. */
  readonly cases: readonly CaseOutcome[];
  readonly schedule: readonly RecallInterval[];
  /** Stability thresholds in mm; default { stable: 0.5, relapse: 1.0 }. */
  readonly thresholds?: StabilityThresholds;
  /** ISO date the audit is computed as of. */
  readonly asOf: string;
}

/** Highest Jemt papilla index. */
const MAX_PAPILLA = 4;

function isMillimetres(value: number): boolean {
  return typeof value === 'number' && value >= 0 && value <= MAX_PLAUSIBLE_MM;
}

function isPapillaScore(value: number): boolean {
  return Number.isInteger(value) && value >= 0 && value <= MAX_PAPILLA;
}

/** Describes the first implausible field of a record, or returns null when the record is usable. */
function recordProblem(record: OutcomeRecord): string | null {
  if (!Number.isFinite(record.patientId)) return `patientId must be a number, got ${String(record.patientId)}`;
  if (!Number.isFinite(record.siteId)) return `siteId must be a number, got ${String(record.siteId)}`;
  if (!isMillimetres(record.baselineRefGm)) return `baselineRefGm must be 0–${MAX_PLAUSIBLE_MM} mm, got ${String(record.baselineRefGm)}`;
  if (record.postOpRefGm !== null && !isMillimetres(record.postOpRefGm)) {
    return `postOpRefGm must be null or 0–${MAX_PLAUSIBLE_MM} mm, got ${String(record.postOpRefGm)}`;
  }
  if (record.recallRefGm !== null && !isMillimetres(record.recallRefGm)) {
    return `recallRefGm must be null or 0–${MAX_PLAUSIBLE_MM} mm, got ${String(record.recallRefGm)}`;
  }
  if (record.baselinePapilla !== null && !isPapillaScore(record.baselinePapilla)) {
    return `baselinePapilla must be null or an integer 0–4, got ${String(record.baselinePapilla)}`;
  }
  if (record.recallPapilla !== null && !isPapillaScore(record.recallPapilla)) {
    return `recallPapilla must be null or an integer 0–4, got ${String(record.recallPapilla)}`;
  }
  return null;
}

/**
 * Margin and papilla outcomes of the rows of one interval (`rows` indexes `records`).
 * Rebound = post-op − recall, retained gain = recall − baseline, % retained =
 * retained / gain × 100 (sites with zero gain left out), on every row with both
 * post-op and recall REF→GM, whatever the site's location.
 */
function summariseInterval(
  records: readonly OutcomeRecord[],
  rows: Int32Array,
  patientOfRow: Int32Array,
  patientSlots: number,
  interval: RecallInterval,
  thresholds: StabilityThresholds,
): IntervalOutcomeSummary {
  const capacity = rows.length;
  const reboundLevels = new LevelledAccumulator(capacity, patientSlots);
  const retainedLevels = new LevelledAccumulator(capacity, patientSlots);
  const percentLevels = new LevelledAccumulator(capacity, patientSlots);
  const papillaChangeLevels = new LevelledAccumulator(capacity, patientSlots);
  const stabilityCounts = { stable: 0, minor: 0, relapse: 0 };
  let flaggedForReview = 0;
  const papillaCounts = new Int32Array(MAX_PAPILLA + 1);
  const papillaPatients = new Uint8Array(patientSlots);
  let papillaPatientCount = 0;
  let improved = 0;
  let unchanged = 0;
  let worsened = 0;

  for (let i = 0; i < rows.length; i++) {
    const record = records[rows[i]];
    const patient = patientOfRow[rows[i]];
    const { baselineRefGm: baseline, postOpRefGm: postOp, recallRefGm: recall } = record;
    // Inline arithmetic rather than the public crownGain/rebound/… functions: the
    // rows were validated once up front, and this loop runs 500,000 times.
    if (postOp !== null && recall !== null) {
      const reboundMm = postOp - recall;
      reboundLevels.add(reboundMm, patient);
      retainedLevels.add(recall - baseline, patient);
      const gain = postOp - baseline;
      if (gain !== 0) percentLevels.add(((recall - baseline) / gain) * 100, patient);
      stabilityCounts[stabilityClass(reboundMm, thresholds)]++;
      if (reboundMm < 0) flaggedForReview++;
    }
    const { recallPapilla, baselinePapilla } = record;
    if (recallPapilla !== null) {
      papillaCounts[recallPapilla]++;
      if (papillaPatients[patient] === 0) {
        papillaPatients[patient] = 1;
        papillaPatientCount++;
      }
      if (baselinePapilla !== null) {
        const change = recallPapilla - baselinePapilla;
        papillaChangeLevels.add(change, patient);
        if (change > 0) improved++;
        else if (change < 0) worsened++;
        else unchanged++;
      }
    }
  }

  const rebound = reboundLevels.summarise();
  const papillaSites = papillaCounts.reduce((sum, count) => sum + count, 0);
  return {
    intervalKey: interval.key,
    label: interval.label,
    targetDays: interval.targetDays,
    nRecords: rows.length,
    nSites: rebound.nSites,
    nPatients: rebound.nPatients,
    rebound,
    retainedGain: retainedLevels.summarise(),
    percentRetained: percentLevels.summarise(),
    stability: {
      thresholds,
      stable: proportionEstimate(stabilityCounts.stable, rebound.nSites),
      minor: proportionEstimate(stabilityCounts.minor, rebound.nSites),
      relapse: proportionEstimate(stabilityCounts.relapse, rebound.nSites),
      flaggedForReview: proportionEstimate(flaggedForReview, rebound.nSites),
    },
    papilla: {
      nSites: papillaSites,
      nPatients: papillaPatientCount,
      distribution: [...papillaCounts].map((count, score) => ({ score, estimate: proportionEstimate(count, papillaSites) })),
      change: papillaChangeLevels.summarise(),
      improved,
      unchanged,
      worsened,
    },
  };
}

/**
 * Cohort summary for the audit screens (DESIGN.md §3–§4). For each recall interval:
 * site-level and patient-level (mean of each patient's sites) descriptive statistics
 * of rebound, retained gain and % retained; shares of stable / minor / relapse sites
 * with Wilson 95% intervals ({@link stabilityClass}), plus negative-rebound sites
 * flagged for review (possible recession / over-exposure); papilla score shares
 * (Jemt 0–4) and change from baseline. Then complications per case
 * ({@link summariseComplications}) and recall completion with loss to follow-up
 * ({@link summariseRecallCompletion}). Every block reports n sites and n patients.
 *
 * Rows whose interval key is not in the schedule are counted and ignored. All rows
 * are validated first (REF→GM 0–20 mm, papilla integer 0–4), so a bad row fails the
 * whole summary with its index rather than skewing it quietly.
 *
 * @param records one row per site per visit
 * @param options { cases, schedule, thresholds?, asOf }
 * @returns the {@link OutcomeSummary}
 * @throws {AnalyticsInputError} on an invalid row, schedule, thresholds, case or date
 */
export function summariseOutcomes(records: readonly OutcomeRecord[], options: SummariseOutcomesOptions): OutcomeSummary {
  assertArray(records, 'summariseOutcomes: records');
  const { cases, schedule, thresholds = DEFAULT_STABILITY_THRESHOLDS, asOf } = options;
  assertRecallSchedule(schedule);
  assertStabilityThresholds(thresholds);
  const recall = summariseRecallCompletion(cases, schedule, asOf);

  const intervalIndex = new Map(schedule.map((interval, k) => [interval.key, k]));
  const patientIndex = new Map<number, number>();
  const siteIds = new Set<number>();
  const intervalOfRow = new Int32Array(records.length);
  const patientOfRow = new Int32Array(records.length);
  const rowsPerInterval = new Int32Array(schedule.length);
  let nUnscheduledRecords = 0;
  for (let row = 0; row < records.length; row++) {
    const record = records[row];
    const problem = recordProblem(record);
    if (problem !== null) throw new AnalyticsInputError(`summariseOutcomes: records[${row}] ${problem}`);
    let patient = patientIndex.get(record.patientId);
    if (patient === undefined) {
      patient = patientIndex.size;
      patientIndex.set(record.patientId, patient);
    }
    patientOfRow[row] = patient;
    siteIds.add(record.siteId);
    const k = intervalIndex.get(record.intervalKey);
    if (k === undefined) {
      intervalOfRow[row] = -1;
      nUnscheduledRecords++;
    } else {
      intervalOfRow[row] = k;
      rowsPerInterval[k]++;
    }
  }

  // Counting sort of row indices by interval, so each interval reads its rows contiguously.
  const starts = new Int32Array(schedule.length + 1);
  for (let k = 0; k < schedule.length; k++) starts[k + 1] = starts[k] + rowsPerInterval[k];
  const order = new Int32Array(starts[schedule.length]);
  const cursor = starts.slice(0, schedule.length);
  for (let row = 0; row < records.length; row++) {
    const k = intervalOfRow[row];
    if (k >= 0) order[cursor[k]++] = row;
  }

  const intervals = schedule.map((interval, k) =>
    summariseInterval(records, order.subarray(starts[k], starts[k + 1]), patientOfRow, patientIndex.size, interval, thresholds),
  );
  return {
    asOf,
    nRecords: records.length,
    nUnscheduledRecords,
    nSites: siteIds.size,
    nPatients: patientIndex.size,
    intervals,
    complications: summariseComplications(cases),
    recall,
  };
}
