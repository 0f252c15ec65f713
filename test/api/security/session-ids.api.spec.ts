import { SessionRow } from '../../../server/entities/session.entity';
import { ApiClient, createTestApp, demoEmail, type TestApp } from '../support/test-app';

/*
 * Session ids (OWASP ASVS 5.0 7.2.3: reference tokens unique, from a CSPRNG, at least 128 bits).
 * express-session 1.19 makes each id with uid-safe: 24 bytes of crypto.randomBytes, written as
 * unpadded base64url, so 32 characters (RFC 4648 §5) carrying 192 bits. The cookie holds
 * `s:<id>.<HMAC signature>`; ApiClient.sessionId() takes the id out of it.
 */

const SIGN_INS = 200;
/** 24 bytes in unpadded base64url: 32 characters of the URL-safe alphabet (RFC 4648 §5). */
const BASE64URL_24_BYTES = /^[A-Za-z0-9_-]{32}$/;

describe('session ids: 192 random bits, unique across sign-ins (ASVS 5.0 7.2.3)', () => {
  let t: TestApp;
  const ids: string[] = [];

  beforeAll(async () => {
    t = await createTestApp();
    for (let index = 0; index < SIGN_INS; index++) {
      const client = new ApiClient(t.app);
      const response = await client.signIn(demoEmail(index % 2 === 0 ? 'clinician' : 'partner'));
      if (response.status !== 200) throw new Error(`Sign-in ${index} failed: ${response.status}`);
      ids.push(client.sessionId());
    }
  });
  afterAll(async () => {
    await t.close();
  });

  it('gives every sign-in an id of 24 bytes (192 bits, at least the 128 ASVS asks) in base64url', () => {
    expect(ids).toHaveLength(SIGN_INS);
    for (const id of ids) {
      expect(id).toMatch(BASE64URL_24_BYTES);
      expect(Buffer.from(id, 'base64url')).toHaveLength(24);
    }
  });

  it(`never repeats an id over ${SIGN_INS} sign-ins of the same two accounts, and stores each one`, async () => {
    expect(new Set(ids).size).toBe(SIGN_INS);
    const stored = await t.dataSource.getRepository(SessionRow).find({ select: { sid: true } });
    const storedIds = new Set(stored.map((row) => row.sid));
    expect(ids.filter((id) => !storedIds.has(id))).toEqual([]);
  });

  it('looks random: about half of all id bits are ones, and no byte position is fixed', () => {
    const bytes = ids.map((id) => Buffer.from(id, 'base64url'));
    let ones = 0;
    for (const id of bytes) for (const byte of id) for (let bit = 0; bit < 8; bit++) ones += (byte >> bit) & 1;
    const bits = SIGN_INS * 24 * 8;
    // Monobit frequency test (NIST SP 800-22 rev. 1a §2.1): for 38,400 fair bits the share of ones
    // has a standard deviation of sqrt(0.25 / 38,400) ≈ 0.0026; ±0.02 is about 8 of them.
    expect(Math.abs(ones / bits - 0.5)).toBeLessThan(0.02);
    for (let position = 0; position < 24; position++) {
      const values = new Set(bytes.map((id) => id[position]));
      // 200 draws of a uniform byte give about 139 distinct values (256 × (1 − (255/256)^200)); a counter or timestamp would give few.
      expect(values.size, `byte ${position}`).toBeGreaterThan(100);
    }
  });
});
