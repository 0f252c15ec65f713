import { readdirSync } from 'node:fs';
import path from 'node:path';
import fc from 'fast-check';
import { POLLUTION_CANARY } from '../generators';
import { acceptedAnswerProblem, errorAnswerProblem } from './answer-checks';
import { databaseDigest } from './db-checksum';
import type { FuzzCase } from './fuzz-case';
import type { FuzzRoute } from './fuzz-route';
import type { FuzzWorld } from './fuzz-world';
import type { Credentials } from './raw-client';
import { bodilessRouteCases, jsonRouteCases } from './json-cases';
import { importRouteCases, photoRouteCases, type UploadAssets } from './upload-cases';

/** How many cases and which seed (printed, so a failure can be replayed). */
export interface FuzzSettings {
  runs: number;
  seed: number;
}

/** What one route's run did, for the timing report. */
export interface RouteReport {
  route: string;
  cases: number;
  accepted2xx: number;
  ms: number;
}

/** The route's key as the route inventory writes it: `POST /api/cases/:id/visits`. */
export function routeName(route: FuzzRoute): string {
  return `${route.method} ${route.path}`;
}

/** A per-route seed from the run's seed, so each route replays alone with the same `FUZZ_SEED`. */
export function routeSeed(settings: FuzzSettings, route: FuzzRoute): number {
  let hash = settings.seed | 0;
  for (const char of routeName(route)) hash = (Math.imul(hash, 31) + char.charCodeAt(0)) | 0;
  return hash;
}

function casesFor(route: FuzzRoute, world: FuzzWorld, assets: UploadAssets): fc.Arbitrary<FuzzCase> {
  switch (route.body) {
    case 'json':
      return jsonRouteCases(route, world.ids);
    case 'none':
      return bodilessRouteCases(route, world.ids);
    case 'photo':
      return photoRouteCases(route, world.ids, assets);
    case 'import':
      return importRouteCases(route, world.ids, assets);
  }
}

/** Every stored photo and workbook file (relative paths, sorted). */
function storedFiles(dataDir: string): string[] {
  return ['uploads', 'exports'].flatMap((folder) => filesUnder(path.join(dataDir, folder)).map((file) => path.join(folder, file)));
}

function filesUnder(root: string): string[] {
  try {
    return readdirSync(root, { recursive: true, withFileTypes: true })
      .filter((entry) => entry.isFile())
      .map((entry) => path.relative(root, path.join(entry.parentPath, entry.name)))
      .sort();
  } catch {
    // No folder yet: nothing was ever written there.
    return [];
  }
}

/** Own property names of the built-in prototypes a pollution payload would reach. */
export function prototypeSnapshot(): string[] {
  return [Object.prototype, Array.prototype, Function.prototype].map((prototype) => Object.getOwnPropertyNames(prototype).sort().join(','));
}

/** Whether a pollution payload reached plain objects (the canary and `isAdmin` keys of generators.ts). */
export function isPolluted(): boolean {
  const probe: Record<string, unknown> = {};
  return probe[POLLUTION_CANARY] !== undefined || probe['isAdmin'] !== undefined;
}

/**
 * Runs the property for one route and checks the store afterwards: every answer right for its
 * case, the database digest and the stored files as before, imports that were accepted ended
 * rejected, and no prototype polluted. Throws with fast-check's report (seed, path, shrunk
 * counterexample) on failure.
 */
export async function fuzzRoute(world: FuzzWorld, route: FuzzRoute, assets: UploadAssets, settings: FuzzSettings): Promise<RouteReport> {
  const t = world.world.t;
  if (route.body === 'none' && route.acceptsIgnoredBody && !route.needsFreshSession) {
    // Let the route do its one legitimate write first (e.g. this week's digests), so later calls are repeats.
    const warmUp = await world.raw.send({ method: route.method, path: route.path, headers: { cookie: world.credentials(route.actor).cookie, 'x-xsrf-token': world.credentials(route.actor).xsrf } });
    if (warmUp.status >= 300) throw new Error(`Warm-up of ${routeName(route)} answered ${warmUp.status}: ${warmUp.text}`);
  }
  const digestBefore = await databaseDigest(t.dataSource);
  const filesBefore = storedFiles(t.dataDir);
  const prototypesBefore = prototypeSnapshot();
  const importJobs: string[] = [];
  let cases = 0;
  let accepted2xx = 0;
  let freshSession: Credentials | undefined;
  const started = performance.now();

  await fc.assert(
    fc.asyncProperty(casesFor(route, world, assets), async (fuzzCase) => {
      cases++;
      const needsFresh = route.body === 'none' && route.needsFreshSession;
      if (needsFresh) freshSession ??= await world.freshAnonymous();
      const answer = await world.raw.send(fuzzCase.withCredentials(freshSession && needsFresh ? freshSession : world.credentials(fuzzCase.actor)));
      // A 2xx of such a route ended the session: the next case needs a new one.
      if (answer.status < 300) freshSession = undefined;
      const problem = fuzzCase.allows2xx ? acceptedAnswerProblem(answer, fuzzCase.allowed) : errorAnswerProblem(answer, fuzzCase.allowed);
      if (problem) throw new Error(`${problem}; answer ${answer.status} ${answer.text.slice(0, 600)}`);
      if (answer.status < 300) {
        accepted2xx++;
        const jobId = typeof answer.json === 'object' && answer.json !== null ? Reflect.get(answer.json, 'jobId') : undefined;
        if (route.body === 'import' && typeof jobId === 'string') importJobs.push(jobId);
      }
      if (isPolluted()) throw new Error('Object.prototype was polluted by this request.');
    }),
    { numRuns: settings.runs, seed: routeSeed(settings, route) },
  );

  await t.imports.idle();
  const unfinished = importJobs.map((jobId) => ({ jobId, job: t.imports.jobs.get(jobId) })).filter(({ job }) => job?.state !== 'rejected');
  expect(unfinished.map(({ jobId, job }) => `${jobId}: ${job?.state} ${JSON.stringify(job?.issues.slice(0, 2))}`), 'every accepted import must end rejected').toEqual([]);
  expect(await databaseDigest(t.dataSource), 'the database must be unchanged').toEqual(digestBefore);
  expect(storedFiles(t.dataDir), 'no photo or workbook file may be stored').toEqual(filesBefore);
  expect(prototypeSnapshot(), 'built-in prototypes must keep their properties').toEqual(prototypesBefore);
  expect(isPolluted()).toBe(false);
  return { route: routeName(route), cases, accepted2xx, ms: Math.round(performance.now() - started) };
}
