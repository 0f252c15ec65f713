import { setTimeout as sleep } from 'node:timers/promises';
import { Secret, TOTP } from 'otpauth';

/** RFC 6238 §4.1 default time step, X = 30 s (the Sign-in protection page says "a new code every 30 seconds"). */
const STEP_MS = 30_000;
/** Digits of a code: 6, the common authenticator-app setting (RFC 4226 §5.3 requires at least 6). */
const DIGITS = 6;
/** Past the step boundary before reading the clock again: the next step has surely begun. */
const BOUNDARY_MARGIN_MS = 100;

/**
 * What an authenticator app does with a key typed in by hand: time-based codes (TOTP, RFC 6238,
 * HMAC-SHA-1, 6 digits, 30-second steps) computed with the `otpauth` library, independently of
 * the server's code. Like a person watching their app, it gives a fresh code only once the step of
 * the last one it handed out has passed, because a verifier must not accept the same step twice
 * (RFC 6238 §5.2).
 */
export class AuthenticatorApp {
  private readonly totp: TOTP;
  /** Time step of the last code handed out (RFC 6238 "T"), or null before the first. */
  private lastStepHandedOut: number | null = null;

  /** @param typedKey the base32 key (RFC 4648) as a page shows it, groups separated by spaces */
  constructor(typedKey: string) {
    this.totp = new TOTP({
      secret: Secret.fromBase32(typedKey.replace(/\s+/g, '')),
      algorithm: 'SHA1',
      digits: DIGITS,
      period: STEP_MS / 1000,
    });
  }

  /**
   * The code of the current step. When the step's code was handed out already, waits for the
   * next step first — never longer than what is left of the current one plus a small margin.
   */
  async freshCode(): Promise<string> {
    const lastStep = this.lastStepHandedOut;
    if (lastStep !== null && stepAt(Date.now()) <= lastStep) {
      await sleep((lastStep + 1) * STEP_MS - Date.now() + BOUNDARY_MARGIN_MS);
    }
    const now = Date.now();
    this.lastStepHandedOut = stepAt(now);
    return this.totp.generate({ timestamp: now });
  }

  /**
   * Six digits that are the code of no step from the previous to the one after next: a verifier
   * accepting the current step ±1 (RFC 6238 §5.2 allows a window for delays) refuses it even if a
   * step boundary passes before it arrives.
   */
  wrongCode(): string {
    const now = Date.now();
    const nearby = new Set([-1, 0, 1, 2].map((offset) => this.totp.generate({ timestamp: now + offset * STEP_MS })));
    const modulus = 10 ** DIGITS;
    let candidate = (Number(this.totp.generate({ timestamp: now })) + 1) % modulus;
    while (nearby.has(String(candidate).padStart(DIGITS, '0'))) candidate = (candidate + 1) % modulus;
    return String(candidate).padStart(DIGITS, '0');
  }
}

/** RFC 6238 §4.2: T = floor((now − T0) / X) with T0 = 0. */
function stepAt(epochMs: number): number {
  return Math.floor(epochMs / STEP_MS);
}
