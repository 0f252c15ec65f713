import { randomBytes, scrypt, timingSafeEqual } from 'node:crypto';

/** scrypt cost parameters, stored with every hash so they can be raised later. */
export interface ScryptCost {
  N: number;
  r: number;
  p: number;
}

/** OWASP Password Storage Cheat Sheet: scrypt with N=2^17, r=8, p=1. Production default. */
export const OWASP_SCRYPT_COST: ScryptCost = { N: 2 ** 17, r: 8, p: 1 };

const KEY_LENGTH = 64;
const SALT_BYTES = 16;

function derive(password: string, salt: Buffer, cost: ScryptCost): Promise<Buffer> {
  // scrypt needs 128·N·r bytes; Node's default maxmem (32 MiB) is below OWASP's cost.
  const maxmem = 128 * cost.N * cost.r * 2;
  return new Promise((resolve, reject) => {
    scrypt(password, salt, KEY_LENGTH, { N: cost.N, r: cost.r, p: cost.p, maxmem }, (error, key) =>
      error ? reject(error) : resolve(key),
    );
  });
}

/** Hashes a password as `scrypt$N$r$p$salt$hash` (base64 salt and hash). */
export async function hashPassword(password: string, cost: ScryptCost = OWASP_SCRYPT_COST): Promise<string> {
  const salt = randomBytes(SALT_BYTES);
  const key = await derive(password, salt, cost);
  return ['scrypt', cost.N, cost.r, cost.p, salt.toString('base64'), key.toString('base64')].join('$');
}

/** Checks a password against a stored hash in constant time. Malformed hashes never match. */
export async function verifyPassword(password: string, stored: string): Promise<boolean> {
  const parts = stored.split('$');
  if (parts.length !== 6 || parts[0] !== 'scrypt') return false;
  const [N, r, p] = parts.slice(1, 4).map(Number);
  if (![N, r, p].every((value) => Number.isInteger(value) && value > 0)) return false;
  const salt = Buffer.from(parts[4], 'base64');
  const expected = Buffer.from(parts[5], 'base64');
  const actual = await derive(password, salt, { N, r, p });
  return actual.length === expected.length && timingSafeEqual(actual, expected);
}
