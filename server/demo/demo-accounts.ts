import type { Role } from '@tidemark/shared';

/** Demo-only password shared by the demo accounts (README). Never use outside a demo. */
export const DEMO_PASSWORD = 'tidemark-demo';

/** One demo account per role; example.org addresses (RFC 2606). */
export const DEMO_ACCOUNTS: ReadonlyArray<{ email: string; displayName: string; role: Role }> = [
  { email: 'admin@example.org', displayName: 'Alex Admin (demo)', role: 'admin' },
  { email: 'lead@example.org', displayName: 'Dr Lena Lead (demo)', role: 'audit_lead' },
  { email: 'clinician@example.org', displayName: 'Dr Cal Clinician (demo)', role: 'clinician' },
  { email: 'partner@example.org', displayName: 'Dr Pat Partner (demo)', role: 'partner' },
  { email: 'governance@example.org', displayName: 'Gwen Governance (demo)', role: 'governance' },
];
