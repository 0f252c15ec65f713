import { Secret } from 'otpauth';
import request from 'supertest';
import { ROLES, type Role, type UserView } from '@tidemark/shared';
import { totpCode } from '../../server/auth/totp';
import { User } from '../../server/entities/user.entity';
import { ApiClient, createTestApp, signedInAs, type TestApp } from './support/test-app';

type Method = 'get' | 'post' | 'patch';
interface RouteCase {
  method: Method;
  path: (t: TestApp) => Promise<string>;
  body?: () => object;
}

let counter = 0;
const ROUTES: Record<string, RouteCase> = {
  'GET /api/users': { method: 'get', path: async () => '/api/users' },
  'POST /api/users': {
    method: 'post',
    path: async () => '/api/users',
    body: () => ({ email: `new.${++counter}@example.org`, displayName: 'New person', role: 'partner', password: 'correct-horse-battery-x' }),
  },
  'PATCH /api/users/:id': {
    method: 'patch',
    path: async (t) => `/api/users/${(await t.dataSource.getRepository(User).findOneByOrFail({ email: 'partner@example.org' })).id}`,
    body: () => ({ displayName: `Dr Pat Partner (demo) ${++counter}` }),
  },
};
/** Expected status per role; admin only (DESIGN.md §2: manage users). */
const ALLOWED: Record<string, Role[]> = { 'GET /api/users': ['admin'], 'POST /api/users': ['admin'], 'PATCH /api/users/:id': ['admin'] };
const SUCCESS: Record<Method, number> = { get: 200, post: 201, patch: 200 };

async function call(client: ApiClient, route: RouteCase, t: TestApp) {
  const path = await route.path(t);
  return route.method === 'get' ? client.get(path) : client.send(route.method, path, route.body?.());
}

describe('/api/users access for every role', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(async () => {
    await t.close();
  });

  for (const [name, route] of Object.entries(ROUTES)) {
    it(`${name}: anonymous gets 401`, async () => {
      const client = new ApiClient(t.app);
      const response = await call(client, route, t);
      expect(response.status).toBe(401);
      expect(response.body.error.code).toBe('unauthenticated');
    });
    for (const role of ROLES) {
      const isAllowed = ALLOWED[name].includes(role);
      it(`${name}: ${role} gets ${isAllowed ? SUCCESS[route.method] : 403}`, async () => {
        const client = await signedInAs(t.app, role);
        const before = await t.dataSource.getRepository(User).count();
        const response = await call(client, route, t);
        expect(response.status).toBe(isAllowed ? SUCCESS[route.method] : 403);
        if (!isAllowed) {
          expect(response.body.error.code).toBe('forbidden');
          expect(await t.dataSource.getRepository(User).count()).toBe(before);
        }
      });
    }
  }
});

describe('/api/users behaviour', () => {
  let t: TestApp;
  let admin: ApiClient;
  beforeAll(async () => {
    t = await createTestApp();
    admin = await signedInAs(t.app, 'admin');
  });
  afterAll(async () => {
    await t.close();
  });

  it('lists users without password hashes', async () => {
    const response = await admin.get('/api/users');
    expect(response.status).toBe(200);
    expect(response.body).toHaveLength(5);
    expect(JSON.stringify(response.body)).not.toMatch(/scrypt|password/i);
    expect(response.body[0]).toEqual(
      expect.objectContaining({ id: expect.any(Number), email: expect.any(String), role: expect.any(String), active: true, createdAt: expect.any(String) }),
    );
  });

  it('creates a user, stores the e-mail lower-cased and the hash with its scrypt parameters', async () => {
    const response = await admin.post('/api/users', { email: 'New.Hygienist@Example.org', displayName: 'New hygienist', role: 'clinician', password: 'gingival-margin-lighthouse' });
    expect(response.status).toBe(201);
    expect(response.body.email).toBe('new.hygienist@example.org');
    const row = await t.dataSource.getRepository(User).findOneByOrFail({ id: response.body.id });
    expect(row.passwordHash).toMatch(/^scrypt\$1024\$8\$1\$[A-Za-z0-9+/=]+\$[A-Za-z0-9+/=]+$/);
    const signIn = await new ApiClient(t.app).signIn('new.hygienist@example.org', 'gingival-margin-lighthouse');
    expect(signIn.status).toBe(200);
  });

  it('answers 409 for an e-mail already on the team, whatever its case', async () => {
    const count = await t.dataSource.getRepository(User).count();
    const response = await admin.post('/api/users', { email: 'LEAD@example.org', displayName: 'Duplicate', role: 'partner', password: 'another-long-passphrase' });
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('conflict');
    expect(await t.dataSource.getRepository(User).count()).toBe(count);
  });

  it('answers 400 with a field error per bad field and stores nothing', async () => {
    const count = await t.dataSource.getRepository(User).count();
    const response = await admin.post('/api/users', { email: 'nope', displayName: '', role: 'dentist', password: 'short' });
    expect(response.status).toBe(400);
    expect(response.body.error.code).toBe('validation');
    expect(Object.keys(response.body.error.fields).sort()).toEqual(['displayName', 'email', 'password', 'role']);
    expect(await t.dataSource.getRepository(User).count()).toBe(count);
  });

  it('refuses a password made only of Tidemark’s context words or the new member’s name (ASVS 5.0 6.2.11)', async () => {
    for (const password of ['Tidemark-Periodontal-2026', 'Wren Hollis Wren Hollis 1']) {
      const response = await admin.post('/api/users', { email: 'wren.hollis@example.org', displayName: 'Wren Hollis', role: 'partner', password });
      expect(response.status).toBe(400);
      expect(response.body.error.fields.password).toMatch(/words anyone would try here/);
    }
    expect(await t.dataSource.getRepository(User).existsBy({ email: 'wren.hollis@example.org' })).toBe(false);
    // Another word of one's own makes it fine.
    expect((await admin.post('/api/users', { email: 'wren.hollis@example.org', displayName: 'Wren Hollis', role: 'partner', password: 'Tidemark-Periodontal-lantern' })).status).toBe(201);
  });

  it('refuses a common password (zxcvbn-ts common-password list)', async () => {
    const response = await admin.post('/api/users', { email: 'weak@example.org', displayName: 'Weak', role: 'partner', password: 'password1234' });
    expect(response.status).toBe(400);
    expect(response.body.error.fields.password).toMatch(/common/);
  });

  it('changes a role, resets a password and ends that person’s sessions', async () => {
    const partner = await signedInAs(t.app, 'partner');
    const id = (await partner.get('/api/auth/me')).body.user.id as number;
    const response = await admin.patch(`/api/users/${id}`, { role: 'governance', password: 'a-fresh-passphrase-77' });
    expect(response.status).toBe(200);
    expect(response.body.role).toBe('governance');
    expect((await partner.get('/api/auth/me')).status).toBe(401);
    expect((await new ApiClient(t.app).signIn('partner@example.org', 'a-fresh-passphrase-77')).body.user.role).toBe('governance');
  });

  it('will not leave the practice without an active admin, nor let an admin deactivate themselves', async () => {
    const me = (await admin.get('/api/auth/me')).body.user.id as number;
    const demote = await admin.patch(`/api/users/${me}`, { role: 'partner' });
    expect(demote.status).toBe(409);
    const deactivate = await admin.patch(`/api/users/${me}`, { active: false });
    expect(deactivate.status).toBe(409);
  });

  it('answers 404 for an unknown id, 400 for a malformed id or an empty change', async () => {
    expect((await admin.patch('/api/users/99999', { displayName: 'Ghost' })).status).toBe(404);
    expect((await admin.patch('/api/users/abc', { displayName: 'Ghost' })).status).toBe(400);
    const empty = await admin.patch('/api/users/1', {});
    expect(empty.status).toBe(400);
    expect(empty.body.error.code).toBe('validation');
  });

  it('strips unknown fields instead of storing them', async () => {
    const response = await admin.post('/api/users', { email: 'extra@example.org', displayName: 'Extra', role: 'partner', password: 'perfectly-fine-passphrase', isSuperuser: true, passwordHash: 'x' });
    expect(response.status).toBe(201);
    expect(response.body).not.toHaveProperty('isSuperuser');
    expect((await new ApiClient(t.app).signIn('extra@example.org', 'perfectly-fine-passphrase')).status).toBe(200);
  });

  it('is not reachable without a session even with a forged cookie', async () => {
    const response = await request(t.app).get('/api/users').set('Cookie', 'tm.sid=s%3Aforged.signature');
    expect(response.status).toBe(401);
  });
});

describe("/api/users: whether each member's sign-in protection is on", () => {
  let t: TestApp;
  let admin: ApiClient;
  beforeAll(async () => {
    t = await createTestApp();
    admin = await signedInAs(t.app, 'admin');
  });
  afterAll(async () => {
    await t.close();
  });

  /** The listed member with this e-mail. */
  async function listed(email: string): Promise<UserView> {
    const response = await admin.get('/api/users');
    expect(response.status).toBe(200);
    const member = (response.body as UserView[]).find((candidate) => candidate.email === email);
    if (!member) throw new Error(`${email} is not listed`);
    return member;
  }

  /** Starts a set-up for the signed-in client; returns the raw secret its authenticator app would hold. */
  async function startCodes(client: ApiClient): Promise<Uint8Array> {
    const started = await client.post('/api/auth/second-factor/enrolment');
    expect(started.status).toBe(200);
    return Secret.fromBase32(started.body.secret).bytes;
  }

  it('lists codes off for everyone at first, and on once a member confirms a set-up (a pending one does not count)', async () => {
    const everyone = (await admin.get('/api/users')).body as UserView[];
    expect(everyone.map((member) => member.secondFactorEnabled)).toEqual(everyone.map(() => false));

    const partner = await signedInAs(t.app, 'partner');
    const partnerSecret = await startCodes(partner);
    expect((await listed('partner@example.org')).secondFactorEnabled).toBe(false);
    // RFC 6238: the code of the current 30-second step confirms the set-up.
    expect((await partner.post('/api/auth/second-factor/enrolment/confirm', { code: totpCode(partnerSecret, Date.now()) })).status).toBe(200);
    expect((await listed('partner@example.org')).secondFactorEnabled).toBe(true);
    expect((await listed('governance@example.org')).secondFactorEnabled).toBe(false);

    const governance = await signedInAs(t.app, 'governance');
    await startCodes(governance);
    expect((await listed('governance@example.org')).secondFactorEnabled).toBe(false);
  });

  it('answers a rename with the same flag, and shows it off again after an administrator resets it', async () => {
    const partner = await listed('partner@example.org');
    const renamed = await admin.patch(`/api/users/${partner.id}`, { displayName: 'Dr Pat Partner (renamed)' });
    expect(renamed.status).toBe(200);
    expect(renamed.body).toMatchObject({ displayName: 'Dr Pat Partner (renamed)', secondFactorEnabled: true });

    expect((await admin.delete(`/api/users/${partner.id}/second-factor`)).status).toBe(204);
    expect((await listed('partner@example.org')).secondFactorEnabled).toBe(false);
  });

  it('reads the whole list in one database query, however many members have codes', async () => {
    for (let n = 0; n < 6; n++) {
      expect((await admin.post('/api/users', { email: `extra.${n}@example.org`, displayName: `Extra member ${n}`, role: 'clinician', password: `a-long-enough-passphrase-${n}` })).status).toBe(201);
    }
    const member = await signedInAs(t.app, 'clinician');
    const secret = await startCodes(member);
    expect((await member.post('/api/auth/second-factor/enrolment/confirm', { code: totpCode(secret, Date.now()) })).status).toBe(200);

    const logQuery = vi.spyOn(t.dataSource.logger, 'logQuery');
    try {
      const members = await t.users.list();
      expect(logQuery).toHaveBeenCalledTimes(1);
      expect(members).toHaveLength(11);
      expect(members.filter((listedMember) => listedMember.secondFactorEnabled).map((listedMember) => listedMember.email)).toEqual(['clinician@example.org']);
      // Still sorted by name, as before the join.
      const names = members.map((listedMember) => listedMember.displayName);
      expect(names).toEqual([...names].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0)));
    } finally {
      logQuery.mockRestore();
    }
  });
});
