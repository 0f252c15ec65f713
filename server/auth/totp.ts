import { Secret, TOTP } from 'otpauth';

/**
 * TOTP settings every common authenticator app understands (RFC 6238 with its defaults:
 * HMAC-SHA-1, 6 digits, 30-second steps). Apps that ignore the URI's parameters still match.
 */
export const TOTP_SETTINGS = { algorithm: 'SHA1', digits: 6, periodSeconds: 30 } as const;

/** Steps either side of the current one that are still accepted (clock drift, slow typing): ±1 step = ±30 s. */
export const TOTP_WINDOW_STEPS = 1;

/** Size of a new secret: 20 bytes = 160 bits, the HMAC-SHA-1 output size RFC 4226 §4 recommends. */
const SECRET_BYTES = 20;

/** Options for {@link matchTotpStep}; production uses {@link TOTP_SETTINGS}. */
export interface TotpCheck {
  /** The shared secret's raw bytes. */
  secret: Uint8Array;
  /** What the person typed (digits only). */
  code: string;
  /** Now, epoch milliseconds (injected so tests can fix time). */
  nowMs: number;
  digits?: number;
  window?: number;
}

/** The time step (RFC 6238 "T") of a moment: whole periods since the Unix epoch. */
export function totpStep(nowMs: number): number {
  return TOTP.counter({ period: TOTP_SETTINGS.periodSeconds, timestamp: nowMs });
}

/**
 * The time step whose code equals `code`, searching the current step ± `window`, or null.
 * Returning the step (not a boolean) lets the caller refuse a code whose step was used already.
 *
 * @example matchTotpStep({ secret, code: '287082', nowMs: 59_000 }) // 1 (RFC 6238 Appendix B, last 6 digits)
 */
export function matchTotpStep(check: TotpCheck): number | null {
  const digits = check.digits ?? TOTP_SETTINGS.digits;
  if (!new RegExp(`^\\d{${digits}}$`).test(check.code)) return null;
  const delta = TOTP.validate({
    token: check.code,
    secret: new Secret({ buffer: copyToArrayBuffer(check.secret) }),
    algorithm: TOTP_SETTINGS.algorithm,
    digits,
    period: TOTP_SETTINGS.periodSeconds,
    timestamp: check.nowMs,
    window: check.window ?? TOTP_WINDOW_STEPS,
  });
  return delta === null ? null : totpStep(check.nowMs) + delta;
}

/** The code for a moment (tests, and nothing else: the server never shows a code). */
export function totpCode(secret: Uint8Array, nowMs: number, digits: number = TOTP_SETTINGS.digits): string {
  return TOTP.generate({
    secret: new Secret({ buffer: copyToArrayBuffer(secret) }),
    algorithm: TOTP_SETTINGS.algorithm,
    digits,
    period: TOTP_SETTINGS.periodSeconds,
    timestamp: nowMs,
  });
}

/** A fresh random secret (otpauth draws it from the platform's CSPRNG, `crypto.getRandomValues`). */
export function newTotpSecret(): Uint8Array {
  return new Secret({ size: SECRET_BYTES }).bytes;
}

/** The secret in base32 (RFC 4648), as authenticator apps take it when typed by hand. */
export function base32Secret(secret: Uint8Array): string {
  return new Secret({ buffer: copyToArrayBuffer(secret) }).base32;
}

/** The `otpauth://totp/Issuer:account?...` key URI that the enrolment QR code holds. */
export function totpKeyUri(secret: Uint8Array, issuer: string, account: string): string {
  return new TOTP({
    issuer,
    label: account,
    secret: new Secret({ buffer: copyToArrayBuffer(secret) }),
    algorithm: TOTP_SETTINGS.algorithm,
    digits: TOTP_SETTINGS.digits,
    period: TOTP_SETTINGS.periodSeconds,
  }).toString();
}

/** otpauth wants an ArrayBuffer of exactly the secret (a Buffer may be a view into a larger pool). */
function copyToArrayBuffer(bytes: Uint8Array): ArrayBuffer {
  const copy = new Uint8Array(bytes.byteLength);
  copy.set(bytes);
  return copy.buffer;
}
