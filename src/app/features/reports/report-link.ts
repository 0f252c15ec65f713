import { REPORTS_LINK, type AuditView } from '@tidemark/shared';

/** What a link into Reports asks for, once the audits are known. */
export type LinkedChoice =
  /** No link (or an empty one): the page chooses as it always does. */
  | { readonly kind: 'none' }
  /** The linked audit, on the linked cycle, or live results. */
  | { readonly kind: 'found'; readonly auditId: number; readonly scope: 'live' | number }
  /** The link names an audit or cycle this person cannot find (removed, or not theirs to see). */
  | { readonly kind: 'missing' };

/**
 * Resolves `?audit=<id>&cycle=<id|live>` (shared/types/reports-link.ts, as the "governance pack
 * ready" e-mail writes it) against the audits the page loaded. A missing or unknown cycle falls
 * back to live results only when the link said so; any other mismatch is "missing".
 */
export function resolveReportsLink(audits: readonly AuditView[], auditParam: string | undefined, cycleParam: string | undefined): LinkedChoice {
  if (!auditParam) return { kind: 'none' };
  const audit = audits.find((candidate) => String(candidate.id) === auditParam);
  if (!audit) return { kind: 'missing' };
  if (cycleParam === undefined || cycleParam === REPORTS_LINK.live) return { kind: 'found', auditId: audit.id, scope: 'live' };
  const cycle = audit.cycles.find((candidate) => String(candidate.id) === cycleParam);
  return cycle ? { kind: 'found', auditId: audit.id, scope: cycle.id } : { kind: 'missing' };
}
