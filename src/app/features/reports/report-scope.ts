import type { AuditView, CycleView } from '@tidemark/shared';

/** What a report covers: one audit, and either its live results (no cycle) or one cycle. */
export interface ReportScope {
  readonly audit: AuditView;
  readonly cycle: CycleView | null;
}

/** A cycle whose results were frozen when it was reported; its workbook never changes. */
export function isFrozen(cycle: CycleView): boolean {
  return cycle.frozenAt !== null;
}

/** The scope in a few words: "live results" or "cycle 2". */
export function scopeWords(scope: ReportScope): string {
  return scope.cycle ? `cycle ${scope.cycle.number}` : 'live results';
}

/**
 * The name the server gives the workbook (`Content-Disposition` of `GET /api/exports/:jobId/file`):
 * `tidemark-governance-audit-<id>-<live|cycle-n>-<UTC day the job started>.xlsx`. The job status
 * does not carry the name, so it is worked out here the same way, from audit and cycle only.
 */
export function workbookFileName(scope: ReportScope, startedAt: Date): string {
  const part = scope.cycle ? `cycle-${scope.cycle.number}` : 'live';
  return `tidemark-governance-audit-${scope.audit.id}-${part}-${startedAt.toISOString().slice(0, 10)}.xlsx`;
}
