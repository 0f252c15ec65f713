import { createHash, randomInt, timingSafeEqual } from 'node:crypto';
import { RECOVERY_CODE_COUNT, RECOVERY_CODE_SYMBOLS, recoveryCodeSchema } from '@tidemark/shared';

/** Crockford's base32 alphabet (no I, L, O, U: nothing to misread when copying from paper). */
const ALPHABET = '0123456789ABCDEFGHJKMNPQRSTVWXYZ';
/** 28 symbols × 5 bits = 140 bits of entropy per code. */
const CODE_LENGTH = RECOVERY_CODE_SYMBOLS;

/**
 * New recovery codes, formatted for people: `ABCD-EFGH-JKMN-PQRS-TVWX-YZ01-2345`.
 * Each symbol is drawn uniformly with `crypto.randomInt` (CSPRNG, no modulo bias).
 */
export function newRecoveryCodes(count: number = RECOVERY_CODE_COUNT): string[] {
  return Array.from({ length: count }, () => {
    const symbols = Array.from({ length: CODE_LENGTH }, () => ALPHABET[randomInt(ALPHABET.length)]).join('');
    return symbols.match(/.{4}/g)?.join('-') ?? symbols;
  });
}

/** The canonical form of a typed code (case, hyphens, spaces and look-alikes ignored), or null if it cannot be one. */
export function canonicalRecoveryCode(typed: string): string | null {
  const parsed = recoveryCodeSchema.safeParse(typed);
  return parsed.success ? parsed.data : null;
}

/**
 * SHA-256 of the canonical code, hex. A fast hash is enough here, unlike for passwords:
 * each code carries 140 random bits, so trying every possible code against a stolen hash
 * (2^140 SHA-256 computations) is out of reach, whereas passwords are guessable and need
 * scrypt's cost. A fast hash also lets the server look a code up by its hash directly.
 */
export function hashRecoveryCode(canonical: string): string {
  return createHash('sha256').update(canonical, 'utf8').digest('hex');
}

/** Constant-time comparison of two hex hashes of equal length. */
export function isSameHash(a: string, b: string): boolean {
  const left = Buffer.from(a, 'hex');
  const right = Buffer.from(b, 'hex');
  return left.length === right.length && timingSafeEqual(left, right);
}
