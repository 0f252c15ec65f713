import type { AuditDataset } from '../shared/types/audit-dataset';
import type { TrendResult } from '../shared/types/audit-results';
import { AnalyticsInputError } from './analytics-input-error';
import { assertArray } from './assert-array';
import { assertAuditDataset } from './assert-audit-dataset';
import { bernoulliCusum } from './bernoulli-cusum';
import { intervalSiteRebounds } from './interval-site-rebounds';
import { isoDateToDayNumber } from './iso-date-to-day-number';
import { pChart } from './p-chart';
import { stabilityClass } from './stability-class';
import { xmrChart } from './xmr-chart';

/** CUSUM design of {@link monthlyTrend}. */
export interface TrendCusumOptions {
  /** Odds ratio R_A of the rate to detect against the baseline (> 0). */
  readonly oddsRatio: number;
  /** Decision threshold h (> 0). */
  readonly h: number;
}

/** Sites of one month of surgery. */
interface MonthTally {
  count: number;
  n: number;
  reboundSum: number;
}

/**
 * Monthly control charts and the complication CUSUM of an audit:
 * - sites measured at the interval are grouped by the month (YYYY-MM) of their case's
 *   surgery; months with no site are skipped; with fewer than 2 such months both charts
 *   are empty (centre, mean and limits null);
 * - relapse: share of sites with rebound > thresholds.relapse per month on a p chart
 *   with 3-sigma per-month limits ({@link pChart}; Montgomery 1991, §6.2);
 * - rebound: mean site rebound per month on an individuals chart ({@link xmrChart};
 *   NIST/SEMATECH e-Handbook §6.3.2.2);
 * - CUSUM: cases (withdrawn included) in order of surgery date, then case id; failure =
 *   at least one complication; Bernoulli CUSUM ({@link bernoulliCusum}; Steiner et al.,
 *   Biostatistics 2000;1:441–452) against p = the dataset's own complication rate, so it
 *   shows drift within the period rather than a comparison with an external standard.
 *   When p is 0 or 1 every case has the same outcome, no log-likelihood ratio exists,
 *   and every point is 0 with no signal. Points are numbered from 0, as signalAt.
 *
 * @param dataset the audit dataset
 * @param intervalKey a key of dataset.schedule
 * @param cusum { oddsRatio, h }; default { oddsRatio: 2, h: 2 }
 * @returns the {@link TrendResult}
 * @throws {AnalyticsInputError} on an unknown interval key, invalid CUSUM options, or an invalid date or case
 */
export function monthlyTrend(
  dataset: AuditDataset,
  intervalKey: string,
  cusum: TrendCusumOptions = { oddsRatio: 2, h: 2 },
): TrendResult {
  assertAuditDataset(dataset, 'monthlyTrend');
  const { oddsRatio, h } = cusum ?? {};
  if (typeof oddsRatio !== 'number' || !Number.isFinite(oddsRatio) || oddsRatio <= 0) {
    throw new AnalyticsInputError(`monthlyTrend: cusum.oddsRatio must be a positive number, got ${String(oddsRatio)}`);
  }
  if (typeof h !== 'number' || !Number.isFinite(h) || h <= 0) {
    throw new AnalyticsInputError(`monthlyTrend: cusum.h must be a positive number, got ${String(h)}`);
  }

  const months = new Map<string, MonthTally>();
  for (const site of intervalSiteRebounds(dataset, intervalKey, 'monthlyTrend')) {
    const { surgeryDate, siteId } = site.record;
    isoDateToDayNumber(surgeryDate, `monthlyTrend: site ${siteId} surgeryDate`);
    const month = surgeryDate.slice(0, 7);
    const tally = months.get(month) ?? { count: 0, n: 0, reboundSum: 0 };
    tally.n++;
    tally.reboundSum += site.rebound;
    if (stabilityClass(site.rebound, dataset.thresholds) === 'relapse') tally.count++;
    months.set(month, tally);
  }
  const ordered = [...months.entries()].sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));

  let relapse: TrendResult['relapse'] = { centre: null, points: [] };
  let rebound: TrendResult['rebound'] = { mean: null, lcl: null, ucl: null, points: [] };
  if (ordered.length >= 2) {
    const chart = pChart(ordered.map(([, { count, n }]) => ({ count, n })));
    relapse = {
      centre: chart.centre,
      points: chart.points.map((point, i) => ({ month: ordered[i][0], count: ordered[i][1].count, n: ordered[i][1].n, ...point })),
    };
    const individuals = xmrChart(ordered.map(([, { reboundSum, n }]) => reboundSum / n));
    rebound = {
      mean: individuals.mean,
      lcl: individuals.lcl,
      ucl: individuals.ucl,
      points: individuals.points.map((point, i) => ({ month: ordered[i][0], ...point })),
    };
  }
  return { intervalKey, relapse, rebound, cusum: complicationCusum(dataset, oddsRatio, h) };
}

/** The complication CUSUM over cases in order of surgery (see {@link monthlyTrend}). */
function complicationCusum(dataset: AuditDataset, oddsRatio: number, h: number): TrendResult['cusum'] {
  const cases = dataset.cases.map((outcome, i) => {
    assertArray(outcome?.complications, `monthlyTrend: cases[${i}].complications`);
    return {
      caseId: outcome.caseId,
      surgeryDate: outcome.surgeryDate,
      day: isoDateToDayNumber(outcome.surgeryDate, `monthlyTrend: cases[${i}].surgeryDate`),
      hadComplication: outcome.complications.length > 0,
    };
  });
  cases.sort((a, b) => a.day - b.day || a.caseId - b.caseId);
  const failures = cases.map((outcome) => outcome.hadComplication);
  const p = cases.length > 0 ? failures.filter(Boolean).length / cases.length : 0;
  const isDegenerate = p === 0 || p === 1;
  const path = isDegenerate ? null : bernoulliCusum(failures, { p, oddsRatio, h });
  return {
    p,
    oddsRatio,
    h,
    points: cases.map((outcome, index) => ({
      index,
      surgeryDate: outcome.surgeryDate,
      value: path === null ? 0 : path.values[index],
      hadComplication: outcome.hadComplication,
    })),
    signalAt: path === null ? [] : path.signalAt,
  };
}
