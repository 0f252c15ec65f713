import type { Role } from '@tidemark/shared';

/** Demo-only password shared by the demo accounts (README). Never use outside a demo. */
export const DEMO_PASSWORD = 'tidemark-demo';

/** A demo account. */
export interface DemoAccount {
  email: string;
  displayName: string;
  role: Role;
}

/** One demo account per role; example.org addresses (RFC 2606). */
export const DEMO_ACCOUNTS: readonly DemoAccount[] = [
  { email: 'admin@example.org', displayName: 'Alex Admin (demo)', role: 'admin' },
  { email: 'lead@example.org', displayName: 'Dr Lena Lead (demo)', role: 'audit_lead' },
  { email: 'clinician@example.org', displayName: 'Dr Cal Clinician (demo)', role: 'clinician' },
  { email: 'partner@example.org', displayName: 'Dr Pat Partner (demo)', role: 'partner' },
  { email: 'governance@example.org', displayName: 'Gwen Governance (demo)', role: 'governance' },
];

/**
 * The demo practice's four operators, in the order the generator indexes them:
 * the demo clinician, the audit lead, and two more clinicians.
 */
export const DEMO_OPERATORS: readonly DemoAccount[] = [
  DEMO_ACCOUNTS[2],
  DEMO_ACCOUNTS[1],
  { email: 'operator.quayle@example.org', displayName: 'Dr Noor Quayle (demo)', role: 'clinician' },
  { email: 'operator.strand@example.org', displayName: 'Dr Ewan Strand (demo)', role: 'clinician' },
];
