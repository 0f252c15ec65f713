import type { ClinicalWorld } from '../support/clinical-fixtures';
import { listApiRoutes, parseRouteKey, routeKey } from '../support/route-inventory';
import { ACTORS, ROUTE_ACCESS, type Actor } from './route-access-table';
import { closeRouteSweep, openRouteSweep, type RouteCallContext, databaseFingerprint, perform } from './route-call-context';
import { ROUTE_CALLS } from './route-calls';

/*
 * CSRF on every state-changing route (STACK-NOTES 16: signed double-submit token bound to the
 * session, OWASP CSRF Prevention Cheat Sheet). For each POST/PATCH/PUT/DELETE route of the
 * access table, a signed-in actor whom the table allows sends a valid call without the
 * X-XSRF-TOKEN header: 403 `csrf` and nothing stored. The same prepared call with the header
 * then succeeds, so the token is the only thing that stopped it.
 */

const WRITES = Object.entries(ROUTE_ACCESS).filter(([key]) => !key.startsWith('GET '));
const SIGNED_IN: readonly Actor[] = ACTORS.filter((actor) => actor !== 'anonymous');

describe('CSRF: every state-changing route refuses a write without the token', () => {
  let world: ClinicalWorld;
  let context: RouteCallContext;

  beforeAll(async () => {
    ({ world, context } = await openRouteSweep());
  });
  afterAll(async () => {
    await closeRouteSweep(world);
  });

  it('covers every POST, PATCH, PUT and DELETE route the app registers', () => {
    const registered = listApiRoutes(world.t).filter((route) => route.method !== 'GET').map(routeKey).sort();
    expect(WRITES.map(([key]) => key).sort()).toEqual(registered);
  });

  for (const [key, expected] of WRITES) {
    // Someone the role check lets through: a success, or a refusal of the service itself (a backup on PostgreSQL: 409).
    const actor = SIGNED_IN.find((candidate) => expected[candidate] < 300 || expected[candidate] === 409);
    it(`${key}: ${actor ?? 'nobody'} without X-XSRF-TOKEN → 403 csrf, nothing stored; with it → ${actor ? expected[actor] : '—'}`, async () => {
      if (!actor) throw new Error(`No signed-in actor may call ${key}: the CSRF check cannot be told apart from the role check.`);
      const { method } = parseRouteKey(key);
      const call = await ROUTE_CALLS[key](context, actor, 'other');
      const client = call.client ?? world.as(actor);
      const before = await databaseFingerprint(world);
      const refused = await perform(client, method, call, { withCsrf: false });
      await world.t.exports.idle();
      await world.t.imports.idle();
      expect(refused.status, JSON.stringify(refused.body)).toBe(403);
      expect(refused.body.error.code).toBe('csrf');
      expect(await databaseFingerprint(world)).toEqual(before);
      const accepted = await perform(client, method, call);
      await world.t.exports.idle();
      await world.t.imports.idle();
      expect(accepted.status, JSON.stringify(accepted.body)).toBe(expected[actor]);
    });
  }
});
