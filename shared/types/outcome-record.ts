/**
 * Outcome data shared by the server, the analytics package and the Angular client.
 * Types only: this file has no runtime code so the client bundle pays nothing for it.
 * Measurement conventions follow DESIGN.md §3 (REF→GM in millimetres).
 */

/** Periodontal phenotype (thin when gingival thickness ≤ 1 mm). */
export type Phenotype = 'thin' | 'thick';

/** Smoking status recorded with the patient. */
export type SmokingStatus = 'never' | 'former' | 'current';

/** Where on the tooth a site is measured. */
export type SiteLocation = 'mid-facial' | 'mesial-papilla' | 'distal-papilla';

/** Clavien–Dindo grade (Dindo, Demartines & Clavien 2004), adapted to dental surgery. */
export type ClavienDindoGrade = 'I' | 'II' | 'IIIa' | 'IIIb' | 'IVa' | 'IVb' | 'V';

/** Stability class of a site from its rebound (DESIGN.md §3). */
export type StabilityClass = 'stable' | 'minor' | 'relapse';

/** Rebound thresholds in mm: ≤ stable → stable; ≤ relapse → minor; > relapse → relapse. */
export interface StabilityThresholds {
  readonly stable: number;
  readonly relapse: number;
}

/** One row per site per recall visit, denormalised with its case and patient. */
export interface OutcomeRecord {
  readonly caseId: number;
  readonly patientId: number;
  readonly operatorId: number;
  readonly phenotype: Phenotype | null;
  readonly procedure: string;
  readonly indication: string;
  readonly smoking: SmokingStatus | null;
  /** ISO date, YYYY-MM-DD. */
  readonly surgeryDate: string;
  readonly siteId: number;
  /** FDI two-digit tooth number (ISO 3950). */
  readonly tooth: number;
  readonly location: SiteLocation;
  /** REF→GM before surgery, mm. */
  readonly baselineRefGm: number;
  /** REF→GM immediately after surgery, mm (null when not recorded). */
  readonly postOpRefGm: number | null;
  /** Jemt papilla index 0–4 before surgery (null for sites without a papilla score). */
  readonly baselinePapilla: number | null;
  /** Key of the recall interval this visit belongs to (see {@link RecallInterval}). */
  readonly intervalKey: string;
  /** ISO date, YYYY-MM-DD. */
  readonly visitDate: string;
  /** REF→GM at this recall, mm (null when not measured). */
  readonly recallRefGm: number | null;
  /** Jemt papilla index 0–4 at this recall. */
  readonly recallPapilla: number | null;
  readonly bleedingOnProbing: boolean | null;
}

/** One interval of an audit's recall schedule, with its tolerance window in days. */
export interface RecallInterval {
  readonly key: string;
  readonly label: string;
  /** Days after surgery at which the recall is due. */
  readonly targetDays: number;
  /** The window opens this many days before the target. */
  readonly windowBeforeDays: number;
  /** The window closes this many days after the target. */
  readonly windowAfterDays: number;
}

/** One complication of a case. */
export interface CaseComplication {
  readonly type: string;
  readonly grade: ClavienDindoGrade;
}

/** A recall visit of a case (the date the patient was seen for an interval). */
export interface CaseVisit {
  readonly intervalKey: string;
  /** ISO date, YYYY-MM-DD. */
  readonly visitDate: string;
}

/** Case-level input for complication rates and recall completion. */
export interface CaseOutcome {
  readonly caseId: number;
  readonly patientId: number;
  readonly operatorId: number;
  /** ISO date, YYYY-MM-DD. */
  readonly surgeryDate: string;
  readonly isWithdrawn: boolean;
  readonly complications: readonly CaseComplication[];
  readonly visits: readonly CaseVisit[];
}

/** Descriptive statistics of one sample (t-based 95% CI; quartiles by R type 7). */
export interface DescriptiveStatistics {
  readonly n: number;
  readonly mean: number;
  /** Sample SD (n − 1); null when n = 1. */
  readonly sd: number | null;
  /** Standard error of the mean; null when n = 1. */
  readonly se: number | null;
  /** t-based 95% CI of the mean; null when n = 1. */
  readonly ci95: readonly [number, number] | null;
  readonly median: number;
  readonly q1: number;
  readonly q3: number;
  readonly min: number;
  readonly max: number;
}

/** A count out of n with its Wilson 95% interval (p and bounds null when n = 0). */
export interface ProportionEstimate {
  readonly count: number;
  readonly n: number;
  readonly p: number | null;
  readonly lower: number | null;
  readonly upper: number | null;
}

/** Site-level and patient-level description of one measure (patient level = mean of each patient's sites). */
export interface LevelledSummary {
  readonly nSites: number;
  readonly nPatients: number;
  readonly site: DescriptiveStatistics | null;
  readonly patient: DescriptiveStatistics | null;
}

/** Shares of sites by stability class at one interval. */
export interface StabilitySummary {
  readonly thresholds: StabilityThresholds;
  readonly stable: ProportionEstimate;
  readonly minor: ProportionEstimate;
  readonly relapse: ProportionEstimate;
  /** Negative rebound (counted as stable too): flagged for review as possible recession / over-exposure. */
  readonly flaggedForReview: ProportionEstimate;
}

/** Papilla scores at one interval and their change from baseline. */
export interface PapillaSummary {
  readonly nSites: number;
  readonly nPatients: number;
  /** The Jemt score itself at this interval, site and patient level. */
  readonly score: LevelledSummary;
  /** Share of each score 0–4 among sites scored at this interval. */
  readonly distribution: readonly { readonly score: number; readonly estimate: ProportionEstimate }[];
  /** Recall score − baseline score, for sites scored at both. */
  readonly change: LevelledSummary;
  readonly improved: number;
  readonly unchanged: number;
  readonly worsened: number;
}

/** Margin and papilla outcomes at one recall interval. */
export interface IntervalOutcomeSummary {
  readonly intervalKey: string;
  readonly label: string;
  readonly targetDays: number;
  /** Rows recorded at this interval (with or without measurements). */
  readonly nRecords: number;
  /** Sites with post-op and recall REF→GM (the rebound sample). */
  readonly nSites: number;
  readonly nPatients: number;
  readonly rebound: LevelledSummary;
  readonly retainedGain: LevelledSummary;
  /** Excludes sites whose crown gain is 0 (% retained undefined). */
  readonly percentRetained: LevelledSummary;
  readonly stability: StabilitySummary;
  readonly papilla: PapillaSummary;
}

/** Complications per case (a case counts once however many complications it had). */
export interface ComplicationSummary {
  readonly nCases: number;
  readonly casesWithComplication: ProportionEstimate;
  readonly byGrade: readonly {
    readonly grade: ClavienDindoGrade;
    /** Complications of this grade. */
    readonly complications: number;
    /** Cases with at least one complication of this grade, out of all cases. */
    readonly cases: ProportionEstimate;
  }[];
  readonly byType: readonly { readonly type: string; readonly complications: number; readonly cases: number }[];
}

/** Recall completion at one interval (withdrawn cases excluded). */
export interface IntervalCompletion {
  readonly intervalKey: string;
  readonly label: string;
  /** Cases whose window has opened by asOf, or that were seen for this interval. */
  readonly due: number;
  readonly seenInWindow: number;
  readonly seenEarly: number;
  readonly seenLate: number;
  /** Window closed with no visit. */
  readonly missed: number;
  /** Window open, no visit yet. */
  readonly pending: number;
  readonly notYetDue: number;
  /** Seen (any time) out of seen + missed. */
  readonly completion: ProportionEstimate;
  /** Seen in window out of seen + missed. */
  readonly inWindow: ProportionEstimate;
}

/** Recall completion and loss to follow-up. */
export interface RecallCompletionSummary {
  readonly asOf: string;
  readonly nCases: number;
  readonly nWithdrawn: number;
  readonly intervals: readonly IntervalCompletion[];
  /** Cases with no visit at their last closed interval or later, out of cases with at least one closed window. */
  readonly lossToFollowUp: ProportionEstimate;
}

/** Cohort summary used by the audit screens. */
export interface OutcomeSummary {
  readonly asOf: string;
  readonly nRecords: number;
  /** Rows whose interval key is not in the schedule (ignored). */
  readonly nUnscheduledRecords: number;
  readonly nSites: number;
  readonly nPatients: number;
  readonly intervals: readonly IntervalOutcomeSummary[];
  readonly complications: ComplicationSummary;
  readonly recall: RecallCompletionSummary;
}
