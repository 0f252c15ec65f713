import type { Role } from '@tidemark/shared';

/** One line per role on what it may do (DESIGN.md §2), shown when choosing a role. */
export const ROLE_SUMMARIES: Readonly<Record<Role, string>> = {
  admin: 'Manages team members, roles and settings; sees records and change history.',
  audit_lead: 'Defines audits and standards, records cases and recalls, exports reports.',
  clinician: 'Records own cases and recalls; sees own results beside anonymised peers.',
  partner: 'Reviews records and results across operators; exports reports.',
  governance: 'Sees de-identified results and exports reports; no patient-level records.',
};
