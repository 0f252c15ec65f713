/**
 * Invented results for specs (never the demo data). Values are chosen to be easy to check
 * by eye: e.g. the 6-month patient-level mean rebound is 0.6 mm with CI 0.4 to 0.8.
 */
import type {
  AuditResults,
  CalibrationResult,
  DescriptiveStatistics,
  FunnelResult,
  IntervalOutcomeSummary,
  LevelledSummary,
  OutcomeSummary,
  ProportionEstimate,
  RecallInterval,
  SurvivalResult,
  TrendResult,
} from '@tidemark/shared';

export const SCHEDULE: RecallInterval[] = [
  { key: '6w', label: '6 weeks', targetDays: 42, windowBeforeDays: 7, windowAfterDays: 14 },
  { key: '6m', label: '6 months', targetDays: 182, windowBeforeDays: 21, windowAfterDays: 30 },
  { key: '12m', label: '12 months', targetDays: 365, windowBeforeDays: 30, windowAfterDays: 60 },
];

export function stats(mean: number, ci: readonly [number, number] | null, n = 10): DescriptiveStatistics {
  return { n, mean, sd: ci ? 0.3 : null, se: ci ? 0.1 : null, ci95: ci, median: mean, q1: mean - 0.25, q3: mean + 0.25, min: mean - 1, max: mean + 1 };
}

export function proportion(count: number, n: number): ProportionEstimate {
  return n === 0 ? { count, n, p: null, lower: null, upper: null } : { count, n, p: count / n, lower: Math.max(0, count / n - 0.1), upper: Math.min(1, count / n + 0.1) };
}

function levelled(nSites: number, nPatients: number, site: DescriptiveStatistics | null, patient: DescriptiveStatistics | null): LevelledSummary {
  return { nSites, nPatients, site, patient };
}

/** One interval; rebound means given as [site, patient]. */
export function intervalSummary(interval: RecallInterval, rebound: readonly [number, number], nSites = 40, nPatients = 10): IntervalOutcomeSummary {
  const stable = Math.round(nSites / 2);
  const relapse = Math.round(nSites / 5);
  return {
    intervalKey: interval.key,
    label: interval.label,
    targetDays: interval.targetDays,
    nRecords: nSites,
    nSites,
    nPatients,
    rebound: levelled(nSites, nPatients, stats(rebound[0], [rebound[0] - 0.1, rebound[0] + 0.1], nSites), stats(rebound[1], [rebound[1] - 0.2, rebound[1] + 0.2], nPatients)),
    retainedGain: levelled(nSites, nPatients, stats(1, [0.9, 1.1]), stats(1, [0.8, 1.2])),
    percentRetained: levelled(nSites, nPatients, stats(60, [55, 65]), stats(62.5, [50, 75])),
    stability: {
      thresholds: { stable: 0.5, relapse: 1 },
      stable: proportion(stable, nSites),
      minor: proportion(nSites - stable - relapse, nSites),
      relapse: proportion(relapse, nSites),
      flaggedForReview: proportion(1, nSites),
    },
    papilla: {
      nSites: 20,
      nPatients: 8,
      score: levelled(20, 8, stats(2.5, [2.2, 2.8]), stats(2.5, [2.1, 2.9])),
      distribution: [0, 2, 4, 10, 4].map((count, score) => ({ score, estimate: proportion(count, 20) })),
      change: levelled(20, 8, stats(0.5, [0.2, 0.8]), stats(0.5, [0.1, 0.9])),
      improved: 8,
      unchanged: 10,
      worsened: 2,
    },
  };
}

export function outcomeSummary(rebounds: readonly (readonly [number, number])[] = [[0.3, 0.35], [0.55, 0.6], [0.7, 0.75]]): OutcomeSummary {
  return {
    asOf: '2030-03-01',
    nRecords: 120,
    nUnscheduledRecords: 0,
    nSites: 40,
    nPatients: 10,
    intervals: SCHEDULE.map((interval, i) => intervalSummary(interval, rebounds[i])),
    complications: { nCases: 12, casesWithComplication: proportion(2, 12), byGrade: [], byType: [] },
    recall: {
      asOf: '2030-03-01',
      nCases: 12,
      nWithdrawn: 1,
      intervals: SCHEDULE.map((interval, i) => ({
        intervalKey: interval.key,
        label: interval.label,
        due: 11 - i,
        seenInWindow: 8 - i,
        seenEarly: 0,
        seenLate: 1,
        missed: 1,
        pending: 1,
        notYetDue: i,
        completion: proportion(9 - i, 10 - i),
        inWindow: proportion(8 - i, 10 - i),
      })),
      lossToFollowUp: proportion(1, 10),
    },
  };
}

export function auditResults(overrides: Partial<AuditResults> = {}): AuditResults {
  return {
    auditId: 1,
    cycleId: null,
    frozenAt: null,
    asOf: '2030-03-01',
    cohort: { cases: 12, patients: 10, sites: 40 },
    thresholds: { stable: 0.5, relapse: 1 },
    schedule: SCHEDULE,
    summary: outcomeSummary(),
    groupBy: null,
    groups: [],
    standards: [],
    reboundHistograms: SCHEDULE.map((interval) => ({
      intervalKey: interval.key,
      bins: [
        { from: -0.5, to: 0, count: 2 },
        { from: 0, to: 0.5, count: 18 },
        { from: 0.5, to: 1, count: 12 },
        { from: 1, to: 1.5, count: 6 },
        { from: 1.5, to: 2, count: 2 },
      ],
    })),
    ...overrides,
  };
}

/** Results split into two invented subgroups. */
export function groupedResults(): AuditResults {
  return auditResults({
    groupBy: 'phenotype',
    groups: [
      { key: 'thin', label: 'Thin', summary: outcomeSummary([[0.2, 0.25], [0.4, 0.45], [0.5, 0.55]]) },
      { key: 'thick', label: 'Thick', summary: outcomeSummary([[0.5, 0.55], [0.9, 0.95], [1.1, 1.2]]) },
    ],
  });
}

export function funnelResult(overrides: Partial<FunnelResult> = {}): FunnelResult {
  const limits = (lower95: number, upper95: number, lower998: number, upper998: number) => ({ limits95: { lower: lower95, upper: upper95 }, limits998: { lower: lower998, upper: upper998 } });
  return {
    measure: 'complication',
    intervalKey: null,
    target: 0.1,
    totalEvents: 9,
    totalN: 60,
    points: [
      { label: 'Operator A', isSelf: false, events: 1, n: 20, rate: 0.05, ...limits(0, 0.25, 0, 0.32), position: 'inside' },
      { label: 'Operator B', isSelf: false, events: 6, n: 20, rate: 0.3, ...limits(0, 0.25, 0, 0.32), position: 'warning-high' },
      { label: 'Me (you)', isSelf: true, events: 2, n: 20, rate: 0.1, ...limits(0, 0.25, 0, 0.32), position: 'inside' },
    ],
    curve: [
      { n: 1, lower95: 0, upper95: 0.8, lower998: 0, upper998: 0.99 },
      { n: 10, lower95: 0, upper95: 0.3, lower998: 0, upper998: 0.45 },
      { n: 20, lower95: 0, upper95: 0.25, lower998: 0, upper998: 0.32 },
    ],
    ...overrides,
  };
}

export function trendResult(): TrendResult {
  return {
    intervalKey: '6m',
    relapse: {
      centre: 0.2,
      points: [
        { month: '2030-01', count: 2, n: 20, p: 0.1, lcl: 0, ucl: 0.47, isOutside: false },
        { month: '2030-02', count: 12, n: 20, p: 0.6, lcl: 0, ucl: 0.47, isOutside: true },
        { month: '2030-03', count: 4, n: 25, p: 0.16, lcl: 0, ucl: 0.44, isOutside: false },
      ],
    },
    rebound: {
      mean: 0.6,
      lcl: 0.1,
      ucl: 1.1,
      points: [
        { month: '2030-01', value: 0.5, isOutside: false },
        { month: '2030-02', value: 1.3, isOutside: true },
        { month: '2030-03', value: 0.6, isOutside: false },
      ],
    },
    cusum: {
      p: 0.1,
      oddsRatio: 2,
      h: 2,
      points: [
        { index: 0, surgeryDate: '2030-01-04', value: 0, hadComplication: false },
        { index: 1, surgeryDate: '2030-01-09', value: 0.9, hadComplication: true },
        { index: 2, surgeryDate: '2030-01-15', value: 2.1, hadComplication: true },
        { index: 3, surgeryDate: '2030-01-20', value: 2.0, hadComplication: false },
      ],
      signalAt: [2],
    },
  };
}

export function survivalResult(median: number | null = null): SurvivalResult {
  return {
    relapseThresholdMm: 1,
    nSites: 40,
    events: 3,
    censored: 37,
    curve: {
      n: 40,
      median,
      steps: [
        { time: 30, atRisk: 40, events: 1, survival: 0.975, lower: 0.9, upper: 0.99 },
        { time: 90, atRisk: 30, events: 2, survival: 0.91, lower: 0.8, upper: 0.96 },
      ],
    },
  };
}

export function calibrationResult(overrides: Partial<CalibrationResult> = {}): CalibrationResult {
  return {
    pairs: 20,
    withinOneMm: proportion(19, 20),
    kappa: { kappa: 0.72, band: 'substantial', weights: 'linear' },
    icc: { icc21: 0.91, icc31: 0.92 },
    blandAltman: { bias: 0.05, sd: 0.4, lower: -0.73, upper: 0.83 },
    meetsCalibrationTarget: true,
    ...overrides,
  };
}
