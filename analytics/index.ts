/**
 * Tidemark analytics: pure statistics and outcome functions, no I/O.
 * Every function documents its formula and source and throws
 * {@link AnalyticsInputError} on bad input.
 */
export { AnalyticsInputError } from './analytics-input-error';

// Descriptive statistics and intervals
export { describe } from './describe';
export { wilsonInterval, type WilsonInterval, type WilsonIntervalOptions } from './wilson-interval';
export { proportionEstimate } from './proportion-estimate';

// Comparisons
export { welchTTest, type TTestResult } from './welch-t-test';
export { pooledTTest } from './pooled-t-test';
export { rankSumTest, rankSumDistribution, type RankSumTestResult } from './rank-sum-test';
export { fisherExact2x2, type FisherExactResult } from './fisher-exact-2x2';
export { chiSquare2x2, type ChiSquare2x2Options, type ChiSquare2x2Result } from './chi-square-2x2';
export type { TwoByTwoTable } from './assert-two-by-two';

// Monitoring over time and between operators
export { pChart, type PChart, type PChartPoint, type PChartSample } from './p-chart';
export { xmrChart, type XmrChart, type XmrPoint } from './xmr-chart';
export { funnelLimits, type FunnelLimits, type FunnelLimitsOptions } from './funnel-limits';
export { bernoulliCusum, type BernoulliCusum, type BernoulliCusumOptions } from './bernoulli-cusum';
export { kaplanMeier, type KaplanMeier, type KaplanMeierStep } from './kaplan-meier';

// Examiner calibration
export { cohenKappa, type CohenKappa, type KappaWeights } from './cohen-kappa';
export { landisKochBand, type AgreementBand } from './landis-koch-band';
export { blandAltman, type BlandAltman, type BlandAltmanOptions } from './bland-altman';
export { icc, type Icc, type IccEstimate } from './icc';

// Outcomes (DESIGN.md §3)
export { crownGain } from './crown-gain';
export { rebound } from './rebound';
export { retainedGain } from './retained-gain';
export { percentRetained } from './percent-retained';
export { stabilityClass, DEFAULT_STABILITY_THRESHOLDS } from './stability-class';
export { isValidFdiTooth } from './is-valid-fdi-tooth';
export { siteOutcome, type SiteReadings } from './site-outcome';
export { planningCheck, MIN_REMAINING_KT_MM, MIN_MARGIN_TO_CREST_MM, type PlannedSite, type PlanningWarning } from './planning-check';
export { isoDateToDayNumber } from './iso-date-to-day-number';

// Cohort summary and standards
export { summariseOutcomes, type SummariseOutcomesOptions } from './summarise-outcomes';
export { summariseComplications } from './summarise-complications';
export { summariseRecallCompletion } from './summarise-recall-completion';
export {
  evaluateStandard,
  type AuditStandard,
  type ObservedValue,
  type StandardEvaluation,
  type StandardVerdict,
} from './evaluate-standard';

// Audit-level results composed from the functions above (AuditDataset in, shared result types out)
export { standardResult } from './standard-result';
export { groupDataset, NOT_RECORDED_KEY, type AuditDatasetGroup } from './group-dataset';
export { reboundHistogram, MAX_HISTOGRAM_BINS } from './rebound-histogram';
export { operatorFunnel, EXACT_LIMITS_BELOW_N, type OperatorFunnelOptions } from './operator-funnel';
export { monthlyTrend, type TrendCusumOptions } from './monthly-trend';
export { timeToRelapse } from './time-to-relapse';
export { newcombeDifferenceInterval, type NewcombeInterval } from './newcombe-difference-interval';
export { compareStandard } from './compare-standard';
export { calibrationAgreement } from './calibration-agreement';
export { cohortCounts } from './cohort-counts';
