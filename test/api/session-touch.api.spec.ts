import { SESSION_IDLE_MS } from '../../server/app';
import { TOUCH_AFTER_MS } from '../../server/auth/session-store';
import { SessionRow } from '../../server/entities/session.entity';
import { createTestApp, setCookieLine, signedInAs, type TestApp } from './support/test-app';

/*
 * Rolling sessions without a database write per request (server/auth/session-store.ts): the row's
 * idle expiry is rewritten only once it is TOUCH_AFTER_MS (1 minute) behind, so a session ends
 * between 29 and 30 minutes after the last request, never later.
 */
describe('session expiry touches', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(async () => {
    await t.close();
  });

  const storedExpiry = async (sid: string): Promise<number> => Number((await t.dataSource.getRepository(SessionRow).findOneByOrFail({ sid })).expiresAt);

  it('keeps the stored expiry for requests within a minute, while the cookie still rolls', async () => {
    const client = await signedInAs(t.app, 'clinician');
    const sid = client.sessionId();
    const before = await storedExpiry(sid);
    const response = await client.get('/api/auth/me');
    expect(response.status).toBe(200);
    expect(setCookieLine(response, 'tm.sid')).toMatch(/Expires=/);
    expect(await storedExpiry(sid)).toBe(before);
  });

  it('rewrites the stored expiry once it is a minute or more behind', async () => {
    const client = await signedInAs(t.app, 'clinician');
    const sid = client.sessionId();
    const behind = Date.now() + SESSION_IDLE_MS - 2 * TOUCH_AFTER_MS;
    await t.dataSource.getRepository(SessionRow).update({ sid }, { expiresAt: behind });
    const startedAt = Date.now();
    expect((await client.get('/api/auth/me')).status).toBe(200);
    const after = await storedExpiry(sid);
    expect(after).toBeGreaterThanOrEqual(startedAt + SESSION_IDLE_MS);
    expect(after).toBeLessThanOrEqual(Date.now() + SESSION_IDLE_MS);
  });

  it('still ends a session whose stored expiry has passed', async () => {
    const client = await signedInAs(t.app, 'clinician');
    await t.dataSource.getRepository(SessionRow).update({ sid: client.sessionId() }, { expiresAt: Date.now() - 1 });
    expect((await client.get('/api/auth/me')).status).toBe(401);
  });
});
