/** The five sign-in roles (DESIGN.md §2). */
export const ROLES = ['admin', 'audit_lead', 'clinician', 'partner', 'governance'] as const;

/** A sign-in role. */
export type Role = (typeof ROLES)[number];

/** Human labels for the roles, used in the interface and in e-mails. */
export const ROLE_LABELS: Readonly<Record<Role, string>> = {
  admin: 'Administrator',
  audit_lead: 'Audit lead',
  clinician: 'Clinician',
  partner: 'Partner',
  governance: 'Governance committee',
};
