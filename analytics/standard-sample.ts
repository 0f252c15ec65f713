import type { StandardView } from '../shared/schemas/standard';
import type { AuditCaseRecord, AuditDataset } from '../shared/types/audit-dataset';
import { CLAVIEN_DINDO_GRADES } from '../shared/types/clinical-terms';
import { STANDARD_METRICS } from '../shared/types/standard-metrics';
import { AnalyticsInputError } from './analytics-input-error';
import { assertArray } from './assert-array';
import { assertAuditDataset } from './assert-audit-dataset';
import { findRecallInterval } from './find-recall-interval';
import { firstRecordPerSite } from './first-record-per-site';
import { intervalSiteRebounds } from './interval-site-rebounds';
import { isoDateToDayNumber } from './iso-date-to-day-number';
import { patientMeans } from './patient-means';
import { summariseRecallCompletion } from './summarise-recall-completion';

/** What a standard's metric is computed from: a count out of n, or one value per patient. */
export type StandardSample =
  | { readonly kind: 'share'; readonly count: number; readonly n: number }
  | { readonly kind: 'mean'; readonly values: readonly number[] };

/** Final impressions at least this many days after surgery (6 weeks; common practice, REFERENCES.md §B). */
export const MIN_IMPRESSION_DAYS = 42;
/** Pain scores strictly above this count in 'share-patients-pain-over-7'. */
const PAIN_LIMIT = 7;
/** Floating-point slack in mm (2.6 − 2.1 must still count as 0.5 mm), far below probe resolution. */
const TOLERANCE_MM = 1e-9;

type Standard = Pick<StandardView, 'criterion' | 'metric' | 'intervalKey' | 'thresholdMm' | 'thresholdPct' | 'minGrade'>;

/**
 * The sample behind an audit standard, exactly as STANDARD_METRIC_INFO[metric].explanation
 * defines it (shared/types/standard-metrics.ts):
 * - 'mean-rebound': per patient, the mean rebound (post-op − recall REF→GM) of their
 *   sites measured at the interval → one value per patient;
 * - 'share-sites-rebound-within': sites with rebound ≤ thresholdMm / sites measured at the interval;
 * - 'share-cases-complication-grade': cases with ≥ 1 complication of Clavien–Dindo grade ≥ minGrade
 *   (order I < II < IIIa < IIIb < IVa < IVb < V; Dindo et al., Ann Surg 2004) / all cases,
 *   withdrawn ones included as in {@link summariseComplications};
 * - 'recall-completion': seen / (seen + missed) at the interval, withdrawn cases excluded
 *   ({@link summariseRecallCompletion} as of dataset.asOf);
 * - 'share-cases-bleeding-under': cases with bleeding score < thresholdPct / cases with a score;
 * - 'share-cases-impression-after-6w': cases with final impression ≥ surgery + 42 days / cases with
 *   an impression date (an impression dated before surgery counts as earlier than 6 weeks);
 * - 'mean-papilla-change': per patient, the mean of (recall − baseline) Jemt score over their sites
 *   scored at both → one value per patient;
 * - 'share-patients-pain-over-7': patients whose worst pain score (over their cases) at the first
 *   recall of the schedule (smallest targetDays; ties: schedule order) is > 7 / patients with a score.
 * Each site counts once per interval (the earlier visit, {@link firstRecordPerSite}).
 *
 * @param standard the standard's metric and parameters
 * @param dataset the audit dataset
 * @param label name of the calling function, used in error messages
 * @returns { kind: 'share', count, n } or { kind: 'mean', values } (per-patient values)
 * @throws {AnalyticsInputError} on an unknown metric, a missing or invalid parameter, an unknown
 *   interval key, or a row or case whose value is implausible
 */
export function standardSample(standard: Standard, dataset: AuditDataset, label: string): StandardSample {
  if (standard === null || typeof standard !== 'object') throw new AnalyticsInputError(`${label}: standard must be an object`);
  assertAuditDataset(dataset, label);
  const metric = standard.metric;
  if (!STANDARD_METRICS.includes(metric)) {
    throw new AnalyticsInputError(`${label}: unknown metric '${String(metric)}'; known metrics: ${STANDARD_METRICS.join(', ')}`);
  }
  const where = `${label} ('${metric}')`;
  switch (metric) {
    case 'mean-rebound': {
      const sites = intervalSiteRebounds(dataset, requiredInterval(standard, dataset, where), where);
      return { kind: 'mean', values: patientMeans(sites.map((site) => ({ patientId: site.record.patientId, value: site.rebound }))) };
    }
    case 'share-sites-rebound-within': {
      const limit = requiredNumber(standard.thresholdMm, 'thresholdMm (mm)', where);
      const sites = intervalSiteRebounds(dataset, requiredInterval(standard, dataset, where), where);
      return { kind: 'share', count: sites.filter((site) => site.rebound <= limit + TOLERANCE_MM).length, n: sites.length };
    }
    case 'share-cases-complication-grade':
      return complicationShare(standard.minGrade, dataset.cases, where);
    case 'recall-completion': {
      const intervalKey = requiredInterval(standard, dataset, where);
      const recall = summariseRecallCompletion(dataset.cases, dataset.schedule, dataset.asOf);
      const completion = recall.intervals.find((interval) => interval.intervalKey === intervalKey)?.completion;
      return { kind: 'share', count: completion?.count ?? 0, n: completion?.n ?? 0 };
    }
    case 'share-cases-bleeding-under':
      return bleedingShare(requiredNumber(standard.thresholdPct, 'thresholdPct (%)', where), dataset.cases, where);
    case 'share-cases-impression-after-6w':
      return impressionShare(dataset.cases, where);
    case 'mean-papilla-change':
      return papillaChange(dataset, requiredInterval(standard, dataset, where), where);
    case 'share-patients-pain-over-7':
      return painShare(dataset, where);
    default:
      throw new AnalyticsInputError(`${label}: unknown metric '${String(metric)}'`);
  }
}

/** The standard's interval key, checked against the schedule. */
function requiredInterval(standard: Standard, dataset: AuditDataset, where: string): string {
  if (standard.intervalKey === null || standard.intervalKey === undefined || standard.intervalKey === '') {
    throw new AnalyticsInputError(`${where}: the standard "${standard.criterion}" needs a recall interval (intervalKey)`);
  }
  return findRecallInterval(dataset.schedule, standard.intervalKey, where).key;
}

/** A parameter that must be a finite number. */
function requiredNumber(value: number | null, name: string, where: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new AnalyticsInputError(`${where}: the standard needs ${name} as a finite number, got ${String(value)}`);
  }
  return value;
}

function complicationShare(minGrade: Standard['minGrade'], cases: readonly AuditCaseRecord[], where: string): StandardSample {
  const minRank = minGrade === null ? -1 : CLAVIEN_DINDO_GRADES.indexOf(minGrade);
  if (minRank < 0) {
    throw new AnalyticsInputError(`${where}: minGrade must be one of ${CLAVIEN_DINDO_GRADES.join(', ')}, got ${String(minGrade)}`);
  }
  let count = 0;
  cases.forEach((outcome, i) => {
    assertArray(outcome?.complications, `${where}: cases[${i}].complications`);
    const ranks = outcome.complications.map(({ grade }, j) => {
      const rank = CLAVIEN_DINDO_GRADES.indexOf(grade);
      if (rank < 0) throw new AnalyticsInputError(`${where}: cases[${i}].complications[${j}].grade is not a Clavien–Dindo grade: ${String(grade)}`);
      return rank;
    });
    if (ranks.some((rank) => rank >= minRank)) count++;
  });
  return { kind: 'share', count, n: cases.length };
}

function bleedingShare(limitPct: number, cases: readonly AuditCaseRecord[], where: string): StandardSample {
  let count = 0;
  let n = 0;
  cases.forEach((outcome, i) => {
    const score = outcome?.bleedingScorePct;
    if (score === null) return;
    if (typeof score !== 'number' || !(score >= 0 && score <= 100)) {
      throw new AnalyticsInputError(`${where}: cases[${i}].bleedingScorePct must be null or 0–100 %, got ${String(score)}`);
    }
    n++;
    if (score < limitPct) count++;
  });
  return { kind: 'share', count, n };
}

function impressionShare(cases: readonly AuditCaseRecord[], where: string): StandardSample {
  let count = 0;
  let n = 0;
  cases.forEach((outcome, i) => {
    const impression = outcome?.finalImpressionDate;
    if (impression === null) return;
    const days = isoDateToDayNumber(impression, `${where}: cases[${i}].finalImpressionDate`) - isoDateToDayNumber(outcome.surgeryDate, `${where}: cases[${i}].surgeryDate`);
    n++;
    if (days >= MIN_IMPRESSION_DAYS) count++;
  });
  return { kind: 'share', count, n };
}

function papillaChange(dataset: AuditDataset, intervalKey: string, where: string): StandardSample {
  const scored = firstRecordPerSite(dataset.records, intervalKey, (record) => record.baselinePapilla !== null && record.recallPapilla !== null, where);
  const changes = scored.map((record) => {
    const { baselinePapilla, recallPapilla } = record;
    if (!isPapillaScore(baselinePapilla) || !isPapillaScore(recallPapilla)) {
      throw new AnalyticsInputError(`${where}: site ${record.siteId} papilla scores must be integers 0–4 (Jemt 1997), got ${String(baselinePapilla)} → ${String(recallPapilla)}`);
    }
    return { patientId: record.patientId, value: recallPapilla - baselinePapilla };
  });
  return { kind: 'mean', values: patientMeans(changes) };
}

function isPapillaScore(score: number | null): score is number {
  return typeof score === 'number' && Number.isInteger(score) && score >= 0 && score <= 4;
}

function painShare(dataset: AuditDataset, where: string): StandardSample {
  // The first recall is the earliest by target day; the stable sort keeps schedule order on ties.
  const firstKey = [...dataset.schedule].sort((a, b) => a.targetDays - b.targetDays)[0].key;
  const worstByPatient = new Map<number, number>();
  dataset.cases.forEach((outcome, i) => {
    if (outcome?.painByInterval === null || typeof outcome?.painByInterval !== 'object') {
      throw new AnalyticsInputError(`${where}: cases[${i}].painByInterval must be an object of scores by interval key`);
    }
    if (!Object.hasOwn(outcome.painByInterval, firstKey)) return;
    const score = outcome.painByInterval[firstKey];
    if (typeof score !== 'number' || !(score >= 0 && score <= 10)) {
      throw new AnalyticsInputError(`${where}: cases[${i}].painByInterval['${firstKey}'] must be a pain score 0–10, got ${String(score)}`);
    }
    worstByPatient.set(outcome.patientId, Math.max(score, worstByPatient.get(outcome.patientId) ?? score));
  });
  const worst = [...worstByPatient.values()];
  return { kind: 'share', count: worst.filter((score) => score > PAIN_LIMIT).length, n: worst.length };
}
