import type { ActionState, AuditResults, CycleState, FunnelResult, OutcomeSummary, StabilityClass } from '@tidemark/shared';

/** Which data a pack describes: live results, or one audit cycle (frozen once reported). */
export type PackScope =
  | { readonly kind: 'live' }
  | {
      readonly kind: 'cycle';
      readonly number: number;
      readonly state: CycleState;
      readonly periodStart: string;
      readonly periodEnd: string;
      /** ISO timestamp of the freeze; null while the cycle is not reported. */
      readonly frozenAt: string | null;
      readonly presentedDate: string | null;
    };

/** The outcome summary of one subgroup (operators appear as letters). */
export interface PackSubgroup {
  /** "All cases", "Operator", "Phenotype", … */
  readonly dimension: string;
  readonly label: string;
  readonly summary: OutcomeSummary;
}

/** One action of the plan (HQIP 2020: action, owner, deadline). */
export interface PackAction {
  readonly cycleNumber: number;
  readonly action: string;
  readonly owner: string;
  /** ISO date; written as a real date (it is the plan's deadline, not patient data). */
  readonly dueDate: string;
  readonly state: ActionState;
}

/**
 * One site at one recall, de-identified (DESIGN.md §7): export-local patient and case codes,
 * operator letters, months instead of dates, no free text and no database ids.
 */
export interface SiteDataRow {
  readonly patient: string;
  readonly caseCode: string;
  readonly operator: string;
  readonly tooth: number;
  readonly location: string;
  readonly phenotype: string;
  readonly procedure: string;
  /** `YYYY-MM`. */
  readonly surgeryMonth: string;
  /** `YYYY-MM`. */
  readonly visitMonth: string;
  readonly interval: string;
  readonly baselineRefGm: number;
  readonly postOpRefGm: number | null;
  readonly recallRefGm: number | null;
  readonly crownGain: number | null;
  readonly rebound: number | null;
  readonly retainedGain: number | null;
  /** 0–100, as analytics computes it. */
  readonly percentRetained: number | null;
  readonly stability: StabilityClass | null;
  readonly isFlaggedForReview: boolean;
  readonly baselinePapilla: number | null;
  readonly recallPapilla: number | null;
  readonly bleedingOnProbing: boolean | null;
}

/** The site rows, produced lazily so that 100,000 rows never sit in memory as cells. */
export interface SiteDataSource {
  readonly count: number;
  rows(): Iterable<SiteDataRow>;
}

/**
 * Everything the governance workbook shows, already de-identified and with free text redacted.
 * Figures come from analytics/ on one snapshot, composed as AuditResultsService does.
 */
export interface GovernancePack {
  readonly auditTitle: string;
  readonly rationale: string;
  readonly leadName: string;
  readonly reauditDate: string | null;
  readonly cohortInWords: string;
  readonly scope: PackScope;
  /** ISO date the workbook was made. */
  readonly producedOn: string;
  /** Role label of the person who asked for it (never a name). */
  readonly producedBy: string;
  /** The headline results, equal to `GET /api/audits/:id/results` for the same scope (groups empty). */
  readonly results: AuditResults;
  readonly subgroups: readonly PackSubgroup[];
  readonly complicationFunnel: FunnelResult;
  readonly actions: readonly PackAction[];
  readonly siteData: SiteDataSource;
}
