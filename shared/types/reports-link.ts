/**
 * The Reports page's address for one audit and scope, as the "governance pack ready" e-mail
 * links it: `/reports?audit=<id>&cycle=<id>`, or `&cycle=live` for live results. The page opens
 * with that audit and scope chosen, so a committee member lands on the pack the e-mail is about.
 */
export const REPORTS_LINK = {
  path: '/reports',
  auditParam: 'audit',
  cycleParam: 'cycle',
  /** The cycle parameter's value for live results. */
  live: 'live',
} as const;

/** `/reports?audit=7&cycle=3` (a cycle) or `/reports?audit=7&cycle=live` (live results). */
export function reportsLinkPath(auditId: number, cycleId: number | null): string {
  const params = new URLSearchParams({ [REPORTS_LINK.auditParam]: String(auditId), [REPORTS_LINK.cycleParam]: cycleId === null ? REPORTS_LINK.live : String(cycleId) });
  return `${REPORTS_LINK.path}?${params.toString()}`;
}
