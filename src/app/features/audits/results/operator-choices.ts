import type { OperatorView, SessionUser } from '@tidemark/shared';

/** One operator the results can be narrowed to, worded for the person looking. */
export interface OperatorChoice {
  readonly id: number;
  readonly label: string;
}

/**
 * Operators the viewer may narrow results to (DESIGN.md §2, same rule as the server's
 * `assertMayNarrow`): the audit lead and partners any operator by name, a clinician only their
 * own cases, governance none (their results are de-identified). Empty: offer no operator filter.
 */
export function operatorChoices(viewer: SessionUser | null, operators: readonly OperatorView[]): OperatorChoice[] {
  if (!viewer) return [];
  if (viewer.role === 'clinician') return [{ id: viewer.id, label: 'My cases only' }];
  if (viewer.role !== 'audit_lead' && viewer.role !== 'partner') return [];
  return [...operators]
    .sort((a, b) => a.displayName.localeCompare(b.displayName))
    .map((operator) => ({ id: operator.id, label: operator.id === viewer.id ? `${operator.displayName} (you)` : operator.displayName }));
}
