import { RECOVERY_CODE_COUNT } from '@tidemark/shared';
import { canonicalRecoveryCode, hashRecoveryCode, isSameHash, newRecoveryCodes } from './recovery-codes';

describe('recovery codes', () => {
  it('issues ten distinct codes of 28 Crockford base32 symbols (140 bits) in groups of four', () => {
    const codes = newRecoveryCodes();
    expect(codes).toHaveLength(RECOVERY_CODE_COUNT);
    expect(RECOVERY_CODE_COUNT).toBe(10);
    expect(new Set(codes).size).toBe(codes.length);
    for (const code of codes) expect(code).toMatch(/^([0-9A-HJKMNP-TV-Z]{4}-){6}[0-9A-HJKMNP-TV-Z]{4}$/);
  });

  it('reads a code typed in lower case, without hyphens, with spaces or with O/I/L look-alikes', () => {
    expect(canonicalRecoveryCode('abcd-efgh-jkmn-pqrs-tvwx-yz01-2345')).toBe('ABCDEFGHJKMNPQRSTVWXYZ012345');
    expect(canonicalRecoveryCode(' ABCD EFGH JKMN PQRS TVWX YZ01 2345 ')).toBe('ABCDEFGHJKMNPQRSTVWXYZ012345');
    // Crockford's base32: O reads as 0, I and L as 1.
    expect(canonicalRecoveryCode('OOOO-IIII-LLLL-0000-1111-2222-3333')).toBe('0000111111110000111122223333');
    expect(canonicalRecoveryCode('ABCD-EFGH-JKMN-PQRS-TVWX-YZ01-234')).toBeNull();
    expect(canonicalRecoveryCode('ABCD-EFGH-JKMN-PQRS')).toBeNull();
    expect(canonicalRecoveryCode('UUUU-UUUU-UUUU-UUUU-UUUU-UUUU-UUUU')).toBeNull();
  });

  it('hashes with SHA-256 and compares hashes', () => {
    // SHA-256("abc") from FIPS 180-2 Appendix B.1.
    expect(hashRecoveryCode('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    expect(isSameHash(hashRecoveryCode('ABCD'), hashRecoveryCode('ABCD'))).toBe(true);
    expect(isSameHash(hashRecoveryCode('ABCD'), hashRecoveryCode('ABCE'))).toBe(false);
    expect(isSameHash(hashRecoveryCode('ABCD'), 'ab')).toBe(false);
  });
});
