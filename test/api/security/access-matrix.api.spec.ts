import type { ClinicalWorld } from '../support/clinical-fixtures';
import { listApiRoutes, parseRouteKey, routeKey } from '../support/route-inventory';
import { ACTORS, REFUSAL_CODES, ROUTE_ACCESS, type Actor } from './route-access-table';
import { closeRouteSweep, openRouteSweep, type RouteCallContext, databaseFingerprint, perform, type CaseOwner } from './route-call-context';
import { ROUTE_CALLS } from './route-calls';

/*
 * Every /api route × every actor, with real ids, against route-access-table.ts (DESIGN.md §2).
 * A refused call (401/403/404) must carry the matching error code and leave the database as it
 * was; a read must store nothing either. One app for the whole matrix; writes get fresh targets.
 */

describe('access matrix: every API route for every actor (DESIGN.md §2)', () => {
  let world: ClinicalWorld;
  let context: RouteCallContext;

  beforeAll(async () => {
    ({ world, context } = await openRouteSweep());
  });
  afterAll(async () => {
    await closeRouteSweep(world);
  });

  it('has a table entry and a call for every registered route, and none for a route that is gone', () => {
    const registered = listApiRoutes(world.t).map(routeKey).sort();
    const tabled = Object.keys(ROUTE_ACCESS).sort();
    expect(registered.filter((key) => !tabled.includes(key)), 'routes missing from route-access-table.ts').toEqual([]);
    expect(tabled.filter((key) => !registered.includes(key)), 'table entries whose route no longer exists').toEqual([]);
    expect(Object.keys(ROUTE_CALLS).sort(), 'route-calls.ts must call exactly the tabled routes').toEqual(tabled);
  });

  async function expectAccess(key: string, actor: Actor, owner: CaseOwner, status: number): Promise<void> {
    const { method } = parseRouteKey(key);
    const call = await ROUTE_CALLS[key](context, actor, owner);
    const before = await databaseFingerprint(world);
    const response = await perform(call.client ?? world.as(actor), method, call);
    // Exports and imports run as background jobs: let them finish before looking at the store.
    await world.t.exports.idle();
    await world.t.imports.idle();
    expect(response.status, `${key} as ${actor}: ${JSON.stringify(response.body)}`).toBe(status);
    if (status >= 400) {
      expect(response.body.error?.code).toBe(REFUSAL_CODES[status]);
      expect(await databaseFingerprint(world), 'a refused call changed the database').toEqual(before);
    } else if (method === 'GET') {
      expect(await databaseFingerprint(world), 'a read changed the database').toEqual(before);
    }
  }

  for (const [key, expected] of Object.entries(ROUTE_ACCESS)) {
    describe(key, () => {
      for (const actor of ACTORS) {
        it(`${actor} → ${expected[actor]}`, () => expectAccess(key, actor, 'other', expected[actor]));
      }
      const own = expected.clinicianOwnCase;
      if (own !== undefined) it(`clinician on their own case → ${own}`, () => expectAccess(key, 'clinician', 'self', own));
    });
  }
});
