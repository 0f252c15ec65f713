import { listApiRoutes } from '../api/support/route-inventory';
import { createTestApp } from '../api/support/test-app';
import { fuzzSettings } from './support/fuzz-settings';
import { FUZZ_ROUTES } from './support/fuzz-routes';
import { createFuzzWorld, type FuzzWorld } from './support/fuzz-world';
import { fuzzRoute, routeName, type RouteReport } from './support/route-property';
import { createUploadAssets, type UploadAssets } from './support/upload-cases';

/*
 * Property-based fuzzing of every write route under /api (fast-check). Each generated request
 * is invalid for a stated reason (a broken body, a refused input, a malformed or unknown id, a
 * wrong content type, bad JSON text, a refused actor or CSRF token, a broken upload), and for
 * each route the property is: every answer is the expected 4xx with a JSON error body and no
 * stack trace, no prototype is polluted, and the database (all tables but sessions) and the
 * stored files are exactly as before the route's run.
 */

const settings = fuzzSettings();
// 30 s of set-up slack plus a generous 150 ms a case (the default run needs ~10 ms a case).
const ROUTE_TIMEOUT_MS = 30_000 + settings.runs * 150;
const GROUPS = [...new Set(FUZZ_ROUTES.map((route) => route.group))];

describe(`write-route fuzz (FUZZ_SEED=${settings.seed}, FUZZ_RUNS=${settings.runs})`, () => {
  const reports: RouteReport[] = [];
  let assets: UploadAssets;

  beforeAll(async () => {
    console.info(`Write-route fuzz: FUZZ_SEED=${settings.seed} FUZZ_RUNS=${settings.runs} (set either to replay or widen the run).`);
    assets = await createUploadAssets();
  });

  afterAll(() => {
    const lines = reports.map((report) => `${report.route.padEnd(48)} ${String(report.cases).padStart(6)} cases ${String(report.accepted2xx).padStart(5)} accepted 2xx ${String(report.ms).padStart(7)} ms`);
    console.info(`Write-route fuzz timings:\n${lines.join('\n')}`);
  });

  it('has an entry for every write route the app registers, and none for a route that is gone', async () => {
    const t = await createTestApp();
    try {
      const registered = listApiRoutes(t)
        .filter((route) => route.method !== 'GET')
        .map((route) => `${route.method} ${route.path}`);
      const fuzzed = FUZZ_ROUTES.map(routeName);
      expect(registered.filter((key) => !fuzzed.includes(key)), 'write routes without a fuzz entry').toEqual([]);
      expect(fuzzed.filter((key) => !registered.includes(key)), 'fuzz entries for routes the app does not have').toEqual([]);
      expect(new Set(fuzzed).size, 'each route fuzzed once').toBe(fuzzed.length);
    } finally {
      await t.close();
    }
  });

  for (const group of GROUPS) {
    describe(`${group} routes (one app)`, () => {
      let world: FuzzWorld;
      beforeAll(async () => {
        world = await createFuzzWorld();
      });
      afterAll(async () => {
        await world?.close();
      });

      for (const route of FUZZ_ROUTES.filter((candidate) => candidate.group === group)) {
        it(`${routeName(route)}: malformed requests get a 4xx JSON error and change nothing`, async () => {
          reports.push(await fuzzRoute(world, route, assets, settings));
        }, ROUTE_TIMEOUT_MS);
      }
    });
  }
});
