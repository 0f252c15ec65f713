import type {
  CaseStatus,
  ComplicationType,
  Indication,
  Instrument,
  PhotoKind,
  Procedure,
  ReferencePoint,
} from './clinical-terms';
import type { ClavienDindoGrade, SiteLocation, StabilityClass } from './outcome-record';
import type { PatientView } from '../schemas/patient';

/** A user who operates or examines, as lists and filters show them. */
export interface OperatorView {
  id: number;
  displayName: string;
}

/** One row of the case list. */
export interface CaseListItem {
  id: number;
  patientCode: string;
  operator: OperatorView;
  surgeryDate: string;
  procedure: Procedure;
  indication: Indication;
  status: CaseStatus;
  phenotype: 'thin' | 'thick';
  teeth: number[];
  visitCount: number;
}

/** `GET /api/cases` answer. */
export interface CaseListPage {
  items: CaseListItem[];
  total: number;
}

/** Derived outcome of one site at one visit, computed on the server with analytics/. */
export interface SiteOutcome {
  /** REF→GM(post-op) − REF→GM(recall); null without a post-op reading. */
  rebound: number | null;
  /** REF→GM(recall) − REF→GM(baseline). */
  retainedGain: number;
  /** Retained / crown gain × 100; null when the gain is 0 or unknown. */
  percentRetained: number | null;
  stability: StabilityClass | null;
  /** Negative rebound: the margin sits further apical than placed (possible recession). */
  isFlaggedForReview: boolean;
}

export interface SiteView {
  id: number;
  tooth: number;
  location: SiteLocation;
  referencePoint: ReferencePoint;
  baselineRefGm: number;
  probingDepth: number | null;
  ktWidth: number | null;
  marginToCrest: number | null;
  papillaScore: number | null;
  plannedExcision: number | null;
  postOpRefGm: number | null;
  /** postOp − baseline; null until post-op is recorded. */
  crownGain: number | null;
  version: number;
}

export interface SiteMeasurementView {
  id: number;
  siteId: number;
  refGm: number;
  probingDepth: number | null;
  bleedingOnProbing: boolean | null;
  ktWidth: number | null;
  papillaScore: number | null;
  outcome: SiteOutcome;
}

export interface VisitView {
  id: number;
  intervalKey: string;
  intervalLabel: string;
  visitDate: string;
  examiner: OperatorView;
  pain: number | null;
  satisfaction: number | null;
  notes: string;
  measurements: SiteMeasurementView[];
  version: number;
}

export interface ComplicationView {
  id: number;
  visitId: number | null;
  type: ComplicationType;
  grade: ClavienDindoGrade;
  onsetDate: string;
  resolutionDate: string | null;
  management: string;
  version: number;
}

export interface PhotoView {
  id: number;
  visitId: number | null;
  kind: PhotoKind;
  contentType: string;
  bytes: number;
  sha256: string;
  width: number;
  height: number;
  monthTaken: string;
  uploadedBy: OperatorView;
  createdAt: string;
}

export interface ChangeRecordView {
  id: number;
  entity: string;
  entityId: number;
  caseId: number | null;
  field: string;
  oldValue: string | null;
  newValue: string | null;
  changedBy: OperatorView;
  changedAt: string;
  reason: string | null;
}

/** `GET /api/cases/:id` answer: the whole case. */
export interface CaseDetail {
  id: number;
  patient: PatientView;
  operator: OperatorView;
  surgeryDate: string;
  procedure: Procedure;
  indication: Indication;
  instrument: Instrument;
  hygienePhaseComplete: boolean;
  bleedingScorePct: number | null;
  plaqueScorePct: number | null;
  deepestProbingMm: number | null;
  sutureResorbable: boolean | null;
  sutureSize: string | null;
  provisionalRestorations: boolean;
  intraOperativeEvents: string;
  finalImpressionDate: string | null;
  finalRestorationDate: string | null;
  status: CaseStatus;
  withdrawnReason: string | null;
  notes: string;
  version: number;
  sites: SiteView[];
  visits: VisitView[];
  complications: ComplicationView[];
  photos: PhotoView[];
  history: ChangeRecordView[];
  /** Planning guidance per site (never a decision). */
  planningChecks: PlanningCheck[];
}

/** A guidance warning from the planning check (DESIGN.md §3). */
export interface PlanningCheck {
  siteId: number | null;
  tooth: number;
  kind: 'keratinized-tissue' | 'crest-distance';
  message: string;
}

/** Where a recall stands relative to its window. */
export type RecallDueState = 'in-window' | 'overdue' | 'upcoming';

/** One recall on the Today list (`GET /api/recalls/due`). */
export interface RecallDueItem {
  caseId: number;
  patientCode: string;
  operator: OperatorView;
  surgeryDate: string;
  intervalKey: string;
  intervalLabel: string;
  targetDate: string;
  windowOpens: string;
  windowCloses: string;
  state: RecallDueState;
  teeth: number[];
}

/** `GET /api/recalls/due` answer, grouped. */
export interface RecallDueList {
  asOf: string;
  inWindow: RecallDueItem[];
  overdue: RecallDueItem[];
  upcoming: RecallDueItem[];
}
