import type { StandardView } from '../schemas/standard';
import type { ScheduleView } from '../schemas/schedule';
import type { CohortDefinition } from '../schemas/audit';
import type { CycleView } from '../schemas/audit-cycle';
import type { OutcomeSummary, ProportionEstimate, RecallInterval, StabilityThresholds } from './outcome-record';

/** A Kaplan–Meier curve as the API returns it (same shape as analytics' kaplanMeier). */
export interface KaplanMeierView {
  readonly n: number;
  readonly steps: readonly { readonly time: number; readonly atRisk: number; readonly events: number; readonly survival: number; readonly lower: number | null; readonly upper: number | null }[];
  readonly median: number | null;
}

/** Subgroup dimensions of the results. */
export const GROUP_BY_OPTIONS = ['operator', 'procedure', 'phenotype', 'indication', 'smoking'] as const;
export type GroupBy = (typeof GROUP_BY_OPTIONS)[number];

/** The observed value of a standard with its 95% CI. */
export interface ObservedStandardValue {
  readonly value: number;
  readonly ci95: readonly [number, number];
  /** Denominator: sites, cases or patients as the metric defines. */
  readonly n: number;
  /** Numerator for shares; null for means. */
  readonly count: number | null;
}

/** A standard with its result. */
export interface StandardResult {
  readonly standard: StandardView;
  readonly unit: '%' | 'mm' | 'score';
  readonly observed: ObservedStandardValue | null;
  readonly verdict: 'met' | 'not-met' | 'inconclusive' | 'no-data';
}

/** One subgroup's summary. Operators are letters ("Operator A") for everyone but the operator themself. */
export interface ResultGroup {
  readonly key: string;
  readonly label: string;
  readonly summary: OutcomeSummary;
}

/** Histogram of site rebound at one interval. */
export interface ReboundHistogram {
  readonly intervalKey: string;
  readonly bins: readonly { readonly from: number; readonly to: number; readonly count: number }[];
}

/** `GET /api/audits/:id/results`. */
export interface AuditResults {
  readonly auditId: number;
  readonly cycleId: number | null;
  /** When the cycle's results were frozen; null for live results. */
  readonly frozenAt: string | null;
  readonly asOf: string;
  readonly cohort: { readonly cases: number; readonly patients: number; readonly sites: number };
  readonly thresholds: StabilityThresholds;
  readonly schedule: readonly RecallInterval[];
  readonly summary: OutcomeSummary;
  readonly groupBy: GroupBy | null;
  readonly groups: readonly ResultGroup[];
  readonly standards: readonly StandardResult[];
  readonly reboundHistograms: readonly ReboundHistogram[];
}

/** `POST /api/audits/cohort-preview`. */
export interface CohortPreview {
  readonly cases: number;
  readonly patients: number;
  readonly sites: number;
}

/** One operator on the funnel plot. */
export interface FunnelPoint {
  readonly label: string;
  readonly isSelf: boolean;
  readonly events: number;
  readonly n: number;
  readonly rate: number;
  readonly limits95: { readonly lower: number; readonly upper: number };
  readonly limits998: { readonly lower: number; readonly upper: number };
  /** Where the point falls: inside the 95% limits, between 95% and 99.8%, or beyond 99.8%. */
  readonly position: 'inside' | 'warning-high' | 'alarm-high' | 'warning-low' | 'alarm-low';
}

/** `GET /api/audits/:id/funnel`: operators' rates against the practice rate (Spiegelhalter 2005). */
export interface FunnelResult {
  readonly measure: 'complication' | 'relapse';
  readonly intervalKey: string | null;
  readonly target: number;
  readonly totalEvents: number;
  readonly totalN: number;
  readonly points: readonly FunnelPoint[];
  /** Limits along n for drawing the funnel. */
  readonly curve: readonly { readonly n: number; readonly lower95: number; readonly upper95: number; readonly lower998: number; readonly upper998: number }[];
}

/** `GET /api/audits/:id/trend`: monthly control charts and the complication CUSUM. */
export interface TrendResult {
  readonly intervalKey: string;
  /** Share of relapse sites per month of surgery (p-chart, 3-sigma). */
  readonly relapse: {
    readonly centre: number | null;
    readonly points: readonly { readonly month: string; readonly count: number; readonly n: number; readonly p: number; readonly lcl: number; readonly ucl: number; readonly isOutside: boolean }[];
  };
  /** Mean site rebound per month of surgery (individuals chart). */
  readonly rebound: {
    readonly mean: number | null;
    readonly lcl: number | null;
    readonly ucl: number | null;
    readonly points: readonly { readonly month: string; readonly value: number; readonly isOutside: boolean }[];
  };
  /** Bernoulli CUSUM of complications in order of surgery (Steiner et al. 2000). */
  readonly cusum: {
    readonly p: number;
    readonly oddsRatio: number;
    readonly h: number;
    readonly points: readonly { readonly index: number; readonly surgeryDate: string; readonly value: number; readonly hadComplication: boolean }[];
    readonly signalAt: readonly number[];
  };
}

/** `GET /api/audits/:id/survival`: time to relapse (Kaplan–Meier), censored at the last recall. */
export interface SurvivalResult {
  readonly relapseThresholdMm: number;
  readonly nSites: number;
  readonly events: number;
  readonly censored: number;
  readonly curve: KaplanMeierView;
}

/** One standard compared between two cycles. */
export interface StandardComparison {
  readonly criterion: string;
  readonly metric: string;
  readonly unit: '%' | 'mm' | 'score';
  readonly first: ObservedStandardValue | null;
  readonly second: ObservedStandardValue | null;
  readonly firstVerdict: StandardResult['verdict'];
  readonly secondVerdict: StandardResult['verdict'];
  /** second − first, with its 95% CI. */
  readonly difference: number | null;
  readonly ci95: readonly [number, number] | null;
  readonly test: 'welch-t' | 'rank-sum' | 'fisher-exact' | null;
  readonly p: number | null;
  /** p < 0.05. */
  readonly isBeyondChance: boolean | null;
}

/** `GET /api/audits/:id/compare?first=&second=`. */
export interface CycleComparison {
  readonly first: { readonly cycleId: number; readonly number: number };
  readonly second: { readonly cycleId: number; readonly number: number };
  readonly standards: readonly StandardComparison[];
}

/** `GET /api/audits/:id/calibration`: agreement of repeated REF→GM readings. */
export interface CalibrationResult {
  readonly pairs: number;
  readonly withinOneMm: ProportionEstimate;
  readonly kappa: { readonly kappa: number; readonly band: string; readonly weights: 'linear' } | null;
  readonly icc: { readonly icc21: number; readonly icc31: number } | null;
  readonly blandAltman: { readonly bias: number; readonly sd: number; readonly lower: number; readonly upper: number } | null;
  /** Andrade et al. 2012: > 90% within ±1 mm and κ > 0.6. */
  readonly meetsCalibrationTarget: boolean | null;
}

/** Audit list and detail. */
export interface AuditView {
  id: number;
  title: string;
  rationale: string;
  lead: { id: number; displayName: string };
  schedule: ScheduleView;
  thresholds: StabilityThresholds;
  cohort: CohortDefinition;
  reauditDate: string | null;
  version: number;
  standards: StandardView[];
  cycles: CycleView[];
}
