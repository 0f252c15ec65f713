import type { OperatorView, SessionUser } from '@tidemark/shared';
import type { OperatorNaming } from './cohort-description';

/**
 * How the signed-in person may see operators named in a cohort: the audit lead and partners
 * by name; clinicians see colleagues anonymised and governance de-identified (DESIGN.md §2),
 * so for them operators are only counted ("2 operators, including you").
 */
export function operatorNamingFor(user: SessionUser | null, operators: readonly OperatorView[]): OperatorNaming {
  if (user?.role === 'audit_lead' || user?.role === 'partner') {
    return { names: new Map(operators.map((operator) => [operator.id, operator.displayName])) };
  }
  return { selfId: user?.role === 'clinician' ? user.id : null };
}
