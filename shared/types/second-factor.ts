import type { SessionResponse } from '../schemas/auth';
import type { Role } from './role';

/**
 * Where a signed-in session stands with the second factor:
 * - `none`: the person has no one-time codes set up and is not required to;
 * - `pending`: the password was right, a one-time or recovery code is still due (no access to anything else);
 * - `enrolment-required`: the role must use one-time codes and has none yet (only the enrolment pages open);
 * - `verified`: a one-time or recovery code was checked in this session.
 */
export const SECOND_FACTOR_STATES = ['none', 'pending', 'enrolment-required', 'verified'] as const;
/** One of {@link SECOND_FACTOR_STATES}. */
export type SecondFactorState = (typeof SECOND_FACTOR_STATES)[number];

/** Whether the practice requires one-time codes of the roles in {@link SECOND_FACTOR_REQUIRED_ROLES} or only offers them. */
export type SecondFactorPolicy = 'required' | 'offered';

/** Roles that must use one-time codes when the policy is `required` (OWASP ASVS 5.0 §6.3.3: privileged accounts). */
export const SECOND_FACTOR_REQUIRED_ROLES: readonly Role[] = ['admin', 'audit_lead'];

/** Whether `role` must use one-time codes under `policy`. */
export function isSecondFactorRequired(role: Role, policy: SecondFactorPolicy): boolean {
  return policy === 'required' && SECOND_FACTOR_REQUIRED_ROLES.includes(role);
}

/** Number of recovery codes issued at a time. */
export const RECOVERY_CODE_COUNT = 10;

/** `GET /api/auth/sign-in-options`: what the sign-in page needs to know before anyone signs in. */
export interface SignInOptions {
  secondFactorPolicy: SecondFactorPolicy;
}

/** `GET /api/auth/second-factor`: the signed-in person's sign-in protection. */
export interface SecondFactorStatus {
  /** One-time codes are switched on. */
  isEnabled: boolean;
  /** When they were switched on (ISO 8601), or null. */
  enabledAt: string | null;
  /** Unused recovery codes left. */
  recoveryCodesLeft: number;
  /** The person's role must use one-time codes under the current policy. */
  isRequired: boolean;
  policy: SecondFactorPolicy;
}

/** `POST /api/auth/second-factor/enrolment`: a new secret to add to an authenticator app. */
export interface SecondFactorEnrolment {
  /** `otpauth://totp/...` key URI (what the QR code holds). */
  otpauthUri: string;
  /** The same secret in base32, for typing in by hand. */
  secret: string;
  /** The QR code as an `image/svg+xml` data URL, rendered on the server. */
  qrCodeDataUrl: string;
  /** Algorithm, digits and period the app must use (the common defaults: SHA-1, 6, 30 s). */
  digits: number;
  periodSeconds: number;
}

/** Recovery codes, shown once (confirmation of enrolment, or a new set). */
export interface RecoveryCodesResponse {
  recoveryCodes: string[];
}

/** `POST /api/auth/second-factor/enrolment/confirm`: codes are on; the recovery codes (shown once) and the renewed session. */
export interface EnrolmentConfirmation extends RecoveryCodesResponse {
  session: SessionResponse;
}
