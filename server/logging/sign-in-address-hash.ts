import { createHmac, hkdfSync } from 'node:crypto';

/** Hex characters kept of the HMAC: 64 bits tell the few addresses of one log apart, and say no more. */
const KEPT_HEX = 16;

/** Turns a typed sign-in address into the keyed hash that log lines carry instead of it. */
export type SignInAddressHash = (email: string) => string;

/**
 * The keyed hash of sign-in addresses for the security log: HMAC-SHA-256 (RFC 2104) of the
 * address as the sign-in compares it (trimmed, lower case), under a key derived from the app
 * secret with HKDF-SHA-256 (RFC 5869) for this purpose only, cut to its first 16 hex characters.
 *
 * Why keyed rather than a plain or publicly salted hash: team addresses are few and guessable,
 * so anyone reading the log could hash a list of candidates and match them. With the key, only
 * someone who also holds the app secret (the investigator on the server) can test "were these
 * refusals aimed at lead@example.org?", while repeated attempts on one address still share one
 * value. An address typed at the sign-in page that belongs to nobody (a typo, someone's private
 * address) thus never reaches the log in clear.
 *
 * @param appSecret the app secret (≥ 32 characters); rotating it changes every hash
 * @example signInAddressHash(secret)(' Lead@Example.org ') === signInAddressHash(secret)('lead@example.org')
 */
export function signInAddressHash(appSecret: string): SignInAddressHash {
  if (appSecret.length < 32) throw new Error('The app secret must be at least 32 characters.');
  const key = Buffer.from(hkdfSync('sha256', appSecret, 'tidemark-security-log', 'sign-in-address', 32));
  return (email) => createHmac('sha256', key).update(email.trim().toLowerCase(), 'utf8').digest('hex').slice(0, KEPT_HEX);
}
