import request from 'supertest';
import { ROLES, type Role } from '@tidemark/shared';
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
    const response = await admin.post('/api/users', { email: 'New.Hygienist@Example.org', displayName: 'New hygienist', role: 'clinician', password: 'gingival-margin-2026' });
    expect(response.status).toBe(201);
    expect(response.body.email).toBe('new.hygienist@example.org');
    const row = await t.dataSource.getRepository(User).findOneByOrFail({ id: response.body.id });
    expect(row.passwordHash).toMatch(/^scrypt\$1024\$8\$1\$[A-Za-z0-9+/=]+\$[A-Za-z0-9+/=]+$/);
    const signIn = await new ApiClient(t.app).signIn('new.hygienist@example.org', 'gingival-margin-2026');
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
