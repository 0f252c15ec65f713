import { SecretBox } from './secret-box';

const APP_SECRET = 'an-app-secret-for-tests-that-is-long-enough-0123';
const plain = new TextEncoder().encode('12345678901234567890');

describe('SecretBox (AES-256-GCM, key from HKDF-SHA-256)', () => {
  it('opens what it sealed for the same owner', () => {
    const box = new SecretBox(APP_SECRET, 'totp-secret');
    expect(box.open(box.seal(plain, 'user:7'), 'user:7')).toEqual(plain);
  });

  it('never stores the plain bytes and uses a fresh nonce each time', () => {
    const box = new SecretBox(APP_SECRET, 'totp-secret');
    const first = box.seal(plain, 'user:7');
    const second = box.seal(plain, 'user:7');
    expect(first).not.toBe(second);
    expect(first).toMatch(/^v1\.[\w-]{16}\.[\w-]{22}\.[\w-]+$/);
    expect(first).not.toContain(Buffer.from(plain).toString('base64url'));
  });

  it('refuses a value sealed for another owner, under another key or purpose, or tampered with', () => {
    const box = new SecretBox(APP_SECRET, 'totp-secret');
    const sealed = box.seal(plain, 'user:7');
    expect(() => box.open(sealed, 'user:8')).toThrow();
    expect(() => new SecretBox(`${APP_SECRET}x`, 'totp-secret').open(sealed, 'user:7')).toThrow();
    expect(() => new SecretBox(APP_SECRET, 'other-purpose').open(sealed, 'user:7')).toThrow();
    const parts = sealed.split('.');
    const body = Buffer.from(parts[3], 'base64url');
    body[0] ^= 1;
    parts[3] = body.toString('base64url');
    expect(() => box.open(parts.join('.'), 'user:7')).toThrow();
    expect(() => box.open('v0.a.b.c', 'user:7')).toThrow('Not a sealed value.');
  });

  it('insists on a long app secret', () => {
    expect(() => new SecretBox('short', 'totp-secret')).toThrow();
  });
});
