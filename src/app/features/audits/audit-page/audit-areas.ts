/** The four areas of an audit page, by their key in the address (`?area=`). */
export const AUDIT_AREAS = [
  { key: 'scope', label: 'Scope' },
  { key: 'criteria', label: 'Criteria' },
  { key: 'results', label: 'Results' },
  { key: 'cycles', label: 'Cycles & actions' },
] as const;

export type AuditArea = (typeof AUDIT_AREAS)[number]['key'];

/** The tab index of an area named in the address; unknown or missing names open Scope. */
export function areaIndex(area: string | null | undefined): number {
  return Math.max(0, AUDIT_AREAS.findIndex((entry) => entry.key === area));
}
