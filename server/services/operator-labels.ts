/** How an operator appears to the person looking. */
export interface OperatorLabel {
  label: string;
  isSelf: boolean;
}

/**
 * Operator names on comparative results (DESIGN.md §2): the audit lead and partners see
 * names; a clinician sees their own name and "Operator A, B, …" for peers; governance
 * sees letters only. Letters follow the operators' ids, so they are stable between views.
 */
export function operatorLabeler(viewer: Express.User, operatorIds: Iterable<number>, names: (id: number) => string): (id: number) => OperatorLabel {
  const ordered = [...new Set(operatorIds)].sort((a, b) => a - b);
  const letters = new Map(ordered.map((id, index) => [id, `Operator ${letterFor(index)}`]));
  const showsNames = viewer.role === 'audit_lead' || viewer.role === 'partner';
  return (id) => {
    const isSelf = viewer.role !== 'governance' && id === viewer.id;
    if (isSelf) return { label: `${names(id)} (you)`, isSelf };
    if (showsNames) return { label: names(id), isSelf };
    return { label: letters.get(id) ?? 'Operator ?', isSelf };
  };
}

/** A, B, …, Z, AA, AB, … */
export function letterFor(index: number): string {
  let label = '';
  let rest = index;
  do {
    label = String.fromCharCode(65 + (rest % 26)) + label;
    rest = Math.floor(rest / 26) - 1;
  } while (rest >= 0);
  return label;
}
