import { hashPassword, OWASP_SCRYPT_COST, verifyPassword } from './password';
import { isCommonPassword } from './common-passwords';

describe('password hashing', () => {
  // Source: OWASP Password Storage Cheat Sheet (scrypt: N=2^17, r=8, p=1).
  it('defaults to OWASP scrypt parameters and stores them with the hash', async () => {
    expect(OWASP_SCRYPT_COST).toEqual({ N: 131072, r: 8, p: 1 });
    const hash = await hashPassword('tidemark-demo-passphrase');
    expect(hash.split('$').slice(0, 4)).toEqual(['scrypt', '131072', '8', '1']);
    expect(await verifyPassword('tidemark-demo-passphrase', hash)).toBe(true);
  });

  it('rejects a wrong password, a tampered hash and a malformed hash', async () => {
    const hash = await hashPassword('right-passphrase', { N: 1024, r: 8, p: 1 });
    expect(await verifyPassword('wrong-passphrase', hash)).toBe(false);
    const parts = hash.split('$');
    parts[5] = Buffer.alloc(64, 1).toString('base64');
    expect(await verifyPassword('right-passphrase', parts.join('$'))).toBe(false);
    expect(await verifyPassword('right-passphrase', 'md5$abc')).toBe(false);
    expect(await verifyPassword('right-passphrase', 'scrypt$x$8$1$a$b')).toBe(false);
  });

  it('salts every hash', async () => {
    const cost = { N: 1024, r: 8, p: 1 };
    expect(await hashPassword('same-passphrase', cost)).not.toBe(await hashPassword('same-passphrase', cost));
  });
});

describe('common passwords', () => {
  // Source: zxcvbn-ts "passwords-common" list (from breach corpora).
  it('knows well-known weak passwords, case-insensitively', () => {
    expect(isCommonPassword('password')).toBe(true);
    expect(isCommonPassword('Password')).toBe(true);
    expect(isCommonPassword('123456789')).toBe(true);
    expect(isCommonPassword('sea-glass-tide-0451')).toBe(false);
  });
});
