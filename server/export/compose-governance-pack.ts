import type { CohortDefinition } from '@tidemark/shared';
import { operatorFunnel } from '@tidemark/analytics';
import type { AuditSnapshot } from '../services/audit-cycle.service';
import { cohortInWords } from './cohort-in-words';
import type { GovernancePack, PackAction, PackScope } from './governance-pack';
import { operatorLetters } from './operator-letters';
import { siteDataSource } from './site-data-rows';
import { snapshotResults, type SnapshotOrigin } from './snapshot-results';
import { subgroupSummaries } from './subgroup-summaries';

/** What the pack needs besides the snapshot: the audit's words and people, already looked up. */
export interface PackContext {
  origin: SnapshotOrigin;
  scope: PackScope;
  auditTitle: string;
  rationale: string;
  leadName: string;
  reauditDate: string | null;
  cohort: CohortDefinition;
  actions: readonly PackAction[];
  producedOn: string;
  producedBy: string;
  /** Cleans free text of patient codes and full dates (see free-text-redactor.ts). */
  redact: (text: string) => string;
}

/**
 * Composes the governance pack from one snapshot, without I/O: headline results, every
 * subgroup, the complications funnel and the site rows, all from analytics/, with operators as
 * letters and free text redacted. The export job and the benchmark both build packs here.
 */
export function composeGovernancePack(snapshot: AuditSnapshot, context: PackContext): GovernancePack {
  const { dataset } = snapshot;
  const { redact } = context;
  const results = snapshotResults(snapshot, context.origin);
  const letter = operatorLetters(dataset);
  const letterOrMark = (operatorId: number): string => letter(operatorId) ?? '?';
  return {
    auditTitle: redact(context.auditTitle),
    rationale: redact(context.rationale),
    leadName: context.leadName,
    reauditDate: context.reauditDate,
    cohortInWords: cohortInWords(context.cohort, letter),
    scope: context.scope,
    producedOn: context.producedOn,
    producedBy: context.producedBy,
    results: {
      ...results,
      standards: results.standards.map((result) => ({
        ...result,
        standard: { ...result.standard, criterion: redact(result.standard.criterion), evidenceSource: redact(result.standard.evidenceSource), exceptions: redact(result.standard.exceptions) },
      })),
    },
    subgroups: subgroupSummaries(dataset, results.summary, letterOrMark),
    complicationFunnel: operatorFunnel(dataset, 'complication', { labelFor: (operatorId) => ({ label: `Operator ${letterOrMark(operatorId)}`, isSelf: false }) }),
    actions: context.actions.map((action) => ({ ...action, action: redact(action.action) })),
    siteData: siteDataSource(dataset, letterOrMark),
  };
}
