import { base32Secret, matchTotpStep, totpCode, totpKeyUri, totpStep } from './totp';

/** The SHA-1 seed of RFC 6238 Appendix B: the ASCII string "12345678901234567890". */
const RFC_SECRET = new TextEncoder().encode('12345678901234567890');

/** RFC 6238 Appendix B, test vectors for mode SHA1 (8 digits, X = 30 s, T0 = 0). */
const RFC_6238_SHA1_ROWS: ReadonlyArray<{ unixSeconds: number; code: string }> = [
  { unixSeconds: 59, code: '94287082' },
  { unixSeconds: 1111111109, code: '07081804' },
  { unixSeconds: 1111111111, code: '14050471' },
  { unixSeconds: 1234567890, code: '89005924' },
  { unixSeconds: 2000000000, code: '69279037' },
  { unixSeconds: 20000000000, code: '65353130' },
];

describe('TOTP against RFC 6238 Appendix B (SHA-1 rows)', () => {
  it.each(RFC_6238_SHA1_ROWS)('T = $unixSeconds s gives $code', ({ unixSeconds, code }) => {
    expect(totpCode(RFC_SECRET, unixSeconds * 1000, 8)).toBe(code);
  });

  it.each(RFC_6238_SHA1_ROWS)('accepts $code at T = $unixSeconds s and names its step floor(T / 30)', ({ unixSeconds, code }) => {
    // RFC 6238 §4.2: T = floor((Current Unix time − T0) / X) with T0 = 0 and X = 30.
    const step = Math.floor(unixSeconds / 30);
    expect(totpStep(unixSeconds * 1000)).toBe(step);
    expect(matchTotpStep({ secret: RFC_SECRET, code, nowMs: unixSeconds * 1000, digits: 8, window: 0 })).toBe(step);
  });

  it('gives the 6-digit code as the last six digits of the 8-digit one', () => {
    // RFC 4226 §5.3: the code is the truncated value mod 10^Digit, so 6 digits are the last 6 of 8.
    expect(totpCode(RFC_SECRET, 59_000)).toBe('287082');
    expect(matchTotpStep({ secret: RFC_SECRET, code: '287082', nowMs: 59_000 })).toBe(1);
  });

  it('refuses a code of another step when the window is 0', () => {
    expect(matchTotpStep({ secret: RFC_SECRET, code: '94287082', nowMs: 1111111109_000, digits: 8, window: 0 })).toBeNull();
  });
});

describe('TOTP window of ±1 step (fixed clock)', () => {
  // 1111111111 s lies in step 37037037 (RFC 6238 Appendix B, "T (hex)" column 00000000023523ED = 37037037).
  const step = 37037037;
  const stepStartMs = step * 30_000;
  const code = totpCode(RFC_SECRET, stepStartMs);

  it.each([
    { when: 'two steps early', offsetSteps: -2, expected: null },
    { when: 'one step early', offsetSteps: -1, expected: step },
    { when: 'in its own step', offsetSteps: 0, expected: step },
    { when: 'one step late', offsetSteps: 1, expected: step },
    { when: 'two steps late', offsetSteps: 2, expected: null },
  ])('matches a code $when: $expected', ({ offsetSteps, expected }) => {
    expect(matchTotpStep({ secret: RFC_SECRET, code, nowMs: stepStartMs + offsetSteps * 30_000 + 29_999 })).toBe(expected);
  });

  it('refuses input that is not exactly six digits', () => {
    for (const typed of ['', '12345', '1234567', 'abcdef', `${code} `]) {
      expect(matchTotpStep({ secret: RFC_SECRET, code: typed, nowMs: stepStartMs })).toBeNull();
    }
  });
});

describe('key URI', () => {
  it('names issuer, account, SHA1, 6 digits and 30 s, with the base32 secret', () => {
    // Base32 of "12345678901234567890" (RFC 4648 §6 alphabet), as authenticator apps take it.
    expect(base32Secret(RFC_SECRET)).toBe('GEZDGNBVGY3TQOJQGEZDGNBVGY3TQOJQ');
    const uri = new URL(totpKeyUri(RFC_SECRET, 'Tidemark', 'lead@example.org'));
    expect(uri.protocol).toBe('otpauth:');
    // Key URI layout otpauth://totp/Issuer:account?… (the de-facto authenticator-app format; common practice).
    expect(uri.host).toBe('totp');
    expect(decodeURIComponent(uri.pathname)).toBe('/Tidemark:lead@example.org');
    expect(Object.fromEntries(uri.searchParams)).toEqual({
      issuer: 'Tidemark',
      secret: 'GEZDGNBVGY3TQOJQGEZDGNBVGY3TQOJQ',
      algorithm: 'SHA1',
      digits: '6',
      period: '30',
    });
  });
});
