import type {
  CaseOutcome,
  OutcomeRecord,
  OutcomeSummary,
  RecallInterval,
  StabilityThresholds,
} from '../shared/types/outcome-record';
import { AnalyticsInputError } from './analytics-input-error';
import { MAX_PLAUSIBLE_MM } from './assert-millimetres';
import { assertRecallSchedule } from './assert-recall-schedule';
import { DistinctIdCounter } from './distinct-id-counter';
import { IntervalAccumulator } from './interval-accumulator';
import { DEFAULT_STABILITY_THRESHOLDS, assertStabilityThresholds } from './stability-class';
import { summariseComplications } from './summarise-complications';
import { summariseRecallCompletion } from './summarise-recall-completion';

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
  if (typeof record !== 'object' || record === null) return 'must be a record object';
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
 * Cohort summary for the audit screens (DESIGN.md §3–§4). For each recall interval:
 * site-level and patient-level (mean of each patient's sites) descriptive statistics
 * of rebound, retained gain and % retained; shares of stable / minor / relapse sites
 * with Wilson 95% intervals ({@link stabilityClass}), plus negative-rebound sites
 * flagged for review (possible recession / over-exposure); papilla score shares
 * (Jemt 0–4) and change from baseline. Then complications per case
 * ({@link summariseComplications}) and recall completion with loss to follow-up
 * ({@link summariseRecallCompletion}). Every block reports n sites and n patients.
 *
 * Rows whose interval key is not in the schedule are counted and ignored. Every row
 * is validated (REF→GM 0–20 mm, papilla integer 0–4), so a bad row fails the whole
 * summary with its index rather than skewing it quietly. Records are read once, in
 * one pass, so they may be an array or any iterable (e.g. a mapped database cursor).
 *
 * @param records one row per site per visit (array or iterable)
 * @param options { cases, schedule, thresholds?, asOf }
 * @returns the {@link OutcomeSummary}
 * @throws {AnalyticsInputError} on an invalid row, schedule, thresholds, case or date
 */
export function summariseOutcomes(records: Iterable<OutcomeRecord>, options: SummariseOutcomesOptions): OutcomeSummary {
  if (records === null || typeof records !== 'object' || !(Symbol.iterator in records)) {
    throw new AnalyticsInputError('summariseOutcomes: records must be an array or another iterable of records');
  }
  const { cases, schedule, thresholds = DEFAULT_STABILITY_THRESHOLDS, asOf } = options;
  assertRecallSchedule(schedule);
  assertStabilityThresholds(thresholds);
  const recall = summariseRecallCompletion(cases, schedule, asOf);

  const intervalIndex = new Map(schedule.map((interval, k) => [interval.key, k]));
  const accumulators = schedule.map((interval) => new IntervalAccumulator(interval, thresholds));
  const patientIndex = new Map<number, number>();
  const siteIds = new DistinctIdCounter();
  let nRecords = 0;
  let nUnscheduledRecords = 0;
  // Rows usually arrive grouped by visit, so the previous row's patient and interval
  // answer most look-ups without touching the maps.
  let lastPatientId = Number.NaN;
  let lastPatient = -1;
  let lastIntervalKey: string | null = null;
  let lastInterval: number | undefined;
  // One streaming pass: records can come straight from a database cursor and are
  // never held, which keeps a 500,000-row cohort within a few megabytes here.
  for (const record of records) {
    const problem = recordProblem(record);
    if (problem !== null) throw new AnalyticsInputError(`summariseOutcomes: records[${nRecords}] ${problem}`);
    nRecords++;
    if (record.patientId !== lastPatientId) {
      let patient = patientIndex.get(record.patientId);
      if (patient === undefined) {
        patient = patientIndex.size;
        patientIndex.set(record.patientId, patient);
      }
      lastPatientId = record.patientId;
      lastPatient = patient;
    }
    siteIds.add(record.siteId);
    if (record.intervalKey !== lastIntervalKey) {
      lastIntervalKey = record.intervalKey;
      lastInterval = intervalIndex.get(record.intervalKey);
    }
    if (lastInterval === undefined) nUnscheduledRecords++;
    else accumulators[lastInterval].add(record, lastPatient);
  }

  return {
    asOf,
    nRecords,
    nUnscheduledRecords,
    nSites: siteIds.size,
    nPatients: patientIndex.size,
    intervals: accumulators.map((accumulator) => accumulator.summarise(patientIndex.size)),
    complications: summariseComplications(cases),
    recall,
  };
}
