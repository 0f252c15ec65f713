import type { DiabetesStatus, Indication, Procedure } from './clinical-terms';
import type { CaseOutcome, OutcomeRecord, Phenotype, RecallInterval, SmokingStatus, StabilityThresholds } from './outcome-record';

/** One case of an audit's cohort with what the standards and subgroups need. */
export interface AuditCaseRecord extends CaseOutcome {
  readonly procedure: Procedure;
  readonly indication: Indication;
  readonly phenotype: Phenotype;
  readonly smoking: SmokingStatus;
  readonly diabetes: DiabetesStatus;
  /** Full-mouth bleeding score before surgery, %. */
  readonly bleedingScorePct: number | null;
  readonly finalImpressionDate: string | null;
  /** Patient-reported pain 0–10 per interval key (only intervals with a visit and a score). */
  readonly painByInterval: Readonly<Record<string, number>>;
}

/**
 * Everything an audit's results are computed from. Live results build it from the
 * database; a frozen cycle stores it, so later data changes never alter its results.
 * Holds no patient codes, names, notes or free text.
 */
export interface AuditDataset {
  readonly asOf: string;
  readonly schedule: readonly RecallInterval[];
  readonly thresholds: StabilityThresholds;
  /** One row per site per recall visit. */
  readonly records: readonly OutcomeRecord[];
  readonly cases: readonly AuditCaseRecord[];
}

/** A pair of repeated readings of one site on one day (examiner calibration). */
export interface CalibrationPair {
  readonly siteId: number;
  readonly measuredOn: string;
  readonly first: number;
  readonly second: number;
  /** Same examiner twice (intra-examiner) or two examiners (inter-examiner). */
  readonly isSameExaminer: boolean;
}
