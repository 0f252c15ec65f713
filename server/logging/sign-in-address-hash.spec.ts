import { signInAddressHash } from './sign-in-address-hash';

const SECRET = 'a-secret-for-the-address-hash-tests-0123456789';

describe('signInAddressHash', () => {
  it('gives one 16-hex value per address as sign-in compares it (trimmed, any case), and none of the address', () => {
    const hash = signInAddressHash(SECRET);
    expect(hash('lead@example.org')).toMatch(/^[0-9a-f]{16}$/);
    expect(hash('  Lead@Example.ORG ')).toBe(hash('lead@example.org'));
    expect(hash('lead2@example.org')).not.toBe(hash('lead@example.org'));
  });

  it('depends on the app secret, so a log reader without it cannot test candidate addresses', () => {
    expect(signInAddressHash(`${SECRET}-rotated`)('lead@example.org')).not.toBe(signInAddressHash(SECRET)('lead@example.org'));
  });

  it('refuses a short secret', () => {
    expect(() => signInAddressHash('short')).toThrow(/at least 32/);
  });
});
