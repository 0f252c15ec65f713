/**
 * The catalogue of measurable criteria an audit standard can use (REFERENCES.md §C:
 * a criterion is an explicit, measurable statement with a target and its evidence).
 */
export const STANDARD_METRICS = [
  'mean-rebound',
  'share-sites-rebound-within',
  'share-cases-complication-grade',
  'recall-completion',
  'share-cases-bleeding-under',
  'share-cases-impression-after-6w',
  'mean-papilla-change',
  'share-patients-pain-over-7',
] as const;
export type StandardMetric = (typeof STANDARD_METRICS)[number];

/** What a metric needs besides the cohort, and how it is read. */
export interface StandardMetricInfo {
  readonly label: string;
  /** '%' for shares (0–100), 'mm' for means in millimetres, 'score' for papilla index points. */
  readonly unit: '%' | 'mm' | 'score';
  readonly needsInterval: boolean;
  readonly needsThresholdMm: boolean;
  readonly needsThresholdPct: boolean;
  readonly needsGrade: boolean;
  /** The comparator that usually makes sense (lower rebound is better, higher completion is better). */
  readonly usualComparator: '>=' | '<=';
  readonly explanation: string;
}

export const STANDARD_METRIC_INFO: Readonly<Record<StandardMetric, StandardMetricInfo>> = {
  'mean-rebound': {
    label: 'Mean rebound at an interval',
    unit: 'mm',
    needsInterval: true,
    needsThresholdMm: false,
    needsThresholdPct: false,
    needsGrade: false,
    usualComparator: '<=',
    explanation: 'Mean of each patient’s mean rebound (post-op − recall REF→GM); 95% CI by the t distribution over patients.',
  },
  'share-sites-rebound-within': {
    label: 'Share of sites with rebound within a limit',
    unit: '%',
    needsInterval: true,
    needsThresholdMm: true,
    needsThresholdPct: false,
    needsGrade: false,
    usualComparator: '>=',
    explanation: 'Sites with rebound ≤ the limit, out of sites measured at the interval; Wilson 95% CI.',
  },
  'share-cases-complication-grade': {
    label: 'Share of cases with a complication of a grade or worse',
    unit: '%',
    needsInterval: false,
    needsThresholdMm: false,
    needsThresholdPct: false,
    needsGrade: true,
    usualComparator: '<=',
    explanation: 'Cases with at least one complication of the Clavien–Dindo grade or higher, out of all cases; Wilson 95% CI.',
  },
  'recall-completion': {
    label: 'Recall completion at an interval',
    unit: '%',
    needsInterval: true,
    needsThresholdMm: false,
    needsThresholdPct: false,
    needsGrade: false,
    usualComparator: '>=',
    explanation: 'Cases seen at the interval, out of cases seen or missed (window closed); withdrawn cases excluded; Wilson 95% CI.',
  },
  'share-cases-bleeding-under': {
    label: 'Share of cases with a bleeding score under a limit before surgery',
    unit: '%',
    needsInterval: false,
    needsThresholdMm: false,
    needsThresholdPct: true,
    needsGrade: false,
    usualComparator: '>=',
    explanation: 'Cases whose full-mouth bleeding score before surgery was under the limit, out of cases with a recorded score; Wilson 95% CI.',
  },
  'share-cases-impression-after-6w': {
    label: 'Share of cases with final impressions no earlier than 6 weeks',
    unit: '%',
    needsInterval: false,
    needsThresholdMm: false,
    needsThresholdPct: false,
    needsGrade: false,
    usualComparator: '>=',
    explanation: 'Cases with the final impression ≥ 42 days after surgery, out of cases with a final impression date; Wilson 95% CI.',
  },
  'mean-papilla-change': {
    label: 'Mean papilla score change at an interval',
    unit: 'score',
    needsInterval: true,
    needsThresholdMm: false,
    needsThresholdPct: false,
    needsGrade: false,
    usualComparator: '>=',
    explanation: 'Mean of each patient’s mean change in papilla index (recall − baseline, Jemt 1997); 95% CI by the t distribution over patients.',
  },
  'share-patients-pain-over-7': {
    label: 'Share of patients reporting pain above 7 at the first recall',
    unit: '%',
    needsInterval: false,
    needsThresholdMm: false,
    needsThresholdPct: false,
    needsGrade: false,
    usualComparator: '<=',
    explanation: 'Patients whose pain score (0–10) at the first recall of the schedule was above 7, out of patients who gave a score; Wilson 95% CI.',
  },
};
