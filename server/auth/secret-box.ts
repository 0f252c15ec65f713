import { createCipheriv, createDecipheriv, hkdfSync, randomBytes } from 'node:crypto';

/** Format tag stored with every sealed value, so the scheme can change later without guessing. */
const VERSION = 'v1';
/** 96-bit nonce: the size NIST SP 800-38D recommends for GCM. */
const NONCE_BYTES = 12;
const TAG_BYTES = 16;

/**
 * Encrypts small secrets at rest (the TOTP shared secrets) with AES-256-GCM.
 *
 * The 256-bit key is derived from the app secret with HKDF-SHA-256 (RFC 5869) under a
 * purpose label, so it is never the session-signing secret itself. Each value gets a
 * fresh random nonce and is bound to its owner through GCM's additional authenticated
 * data (e.g. `user:7`): a sealed value copied onto another row does not open.
 * Rotating the app secret makes sealed values unreadable (people then set up their
 * one-time codes again after an administrator's reset).
 */
export class SecretBox {
  private readonly key: Buffer;

  /** @param appSecret the app's secret (≥ 32 characters) @param purpose a label that separates keys for different uses */
  constructor(appSecret: string, purpose: string) {
    if (appSecret.length < 32) throw new Error('The app secret must be at least 32 characters.');
    this.key = Buffer.from(hkdfSync('sha256', appSecret, 'tidemark-secret-box', purpose, 32));
  }

  /** `v1.<nonce>.<tag>.<ciphertext>` in base64url. */
  seal(plain: Uint8Array, owner: string): string {
    const nonce = randomBytes(NONCE_BYTES);
    const cipher = createCipheriv('aes-256-gcm', this.key, nonce, { authTagLength: TAG_BYTES });
    cipher.setAAD(Buffer.from(owner, 'utf8'));
    const sealed = Buffer.concat([cipher.update(plain), cipher.final()]);
    return [VERSION, nonce.toString('base64url'), cipher.getAuthTag().toString('base64url'), sealed.toString('base64url')].join('.');
  }

  /**
   * The plain bytes of a value sealed for `owner`.
   * @throws {Error} when the value is malformed, tampered with, sealed for another owner or under another key
   */
  open(value: string, owner: string): Uint8Array {
    const parts = value.split('.');
    if (parts.length !== 4 || parts[0] !== VERSION) throw new Error('Not a sealed value.');
    const [nonce, tag, sealed] = parts.slice(1).map((part) => Buffer.from(part, 'base64url'));
    if (nonce.length !== NONCE_BYTES || tag.length !== TAG_BYTES) throw new Error('Not a sealed value.');
    const decipher = createDecipheriv('aes-256-gcm', this.key, nonce, { authTagLength: TAG_BYTES });
    decipher.setAAD(Buffer.from(owner, 'utf8'));
    decipher.setAuthTag(tag);
    // final() throws when the tag does not verify: tampering, wrong owner or wrong key.
    return new Uint8Array(Buffer.concat([decipher.update(sealed), decipher.final()]));
  }
}
