/**
 * Benchmark: API throughput and tail latency of two signed-in endpoints against a bare Express
 * route in the same server process.
 *
 * The bench server (support/bench-server.ts: the real app from createApp, demo practice seeded
 * into a temporary data dir) runs as a child process so autocannon's load generator never shares
 * its event loop. Signed in once as the partner (who sees every case and every audit's results); the
 * session and XSRF cookies go with every request, as a browser's would. Each target: a 2 s
 * warm-up, then autocannon 10 s, 50 connections, on 127.0.0.1:
 *  - floor — `GET /bench/hello`, measured before and after the endpoints (their mean is the floor,
 *    so load that drifts during the run falls on both sides);
 *  - `GET /api/cases?pageSize=50` — goal: ≥ 0.35 × the floor's req/s and p99 ≤ 50 ms;
 *  - `GET /api/audits/:id/results` (live results of the first demo audit, served from the results
 *    cache while nothing changes) — goal: p99 ≤ 150 ms;
 *  - `GET /api/auth/me`, for context only (no goal): the cheapest signed-in request, i.e. what the
 *    shared middleware (session read, user, second-factor state, CSRF check, helmet, logging) costs.
 * Prints one line per endpoint, name "api-throughput". Case list: value = req/s, floor = the floor's
 * req/s, ratio. Results (a latency goal): value = p99 ms, floor = the floor's p99, ratio, with
 * requestsPerSecond and requestsRatio beside them. Both carry p99Ms and floorP99Ms, signedInBaseline (req/s of /api/auth/me), the server's peak RSS.
 */
import autocannon from 'autocannon';
import * as z from 'zod';
import { DEMO_PASSWORD } from '../../server/demo/demo-accounts';
import { printBenchLine, ratioOf } from './support/bench-line';
import { startBenchServer } from './support/bench-server-process';
import { processPeakRssMb } from './support/peak-rss';
import { signIn } from './support/signed-in-session';

const CONNECTIONS = 50;
const DURATION_S = 10;
const WARM_UP_S = 2;

/** What one autocannon run measured. */
interface LoadResult {
  requestsPerSecond: number;
  p99Ms: number;
  requests: number;
  /** Connection errors, timeouts (10 s) included: counted against the goal, as a user would feel them. */
  errors: number;
}

async function load(label: string, url: string, headers: Record<string, string>, durationS: number): Promise<LoadResult> {
  const result = await autocannon({ url, connections: CONNECTIONS, duration: durationS, headers });
  // A refused or failed request (signed out, 500) would measure the wrong thing: stop.
  if (result.non2xx > 0) throw new Error(`${label}: ${result.non2xx} of ${result.requests.total} answers were not 2xx`);
  return { requestsPerSecond: Math.round(result.requests.average), p99Ms: result.latency.p99, requests: result.requests.total, errors: result.errors };
}

/** A warm-up run (JIT, SQLite page cache, results cache), then the measured one. */
async function measure(label: string, url: string, headers: Record<string, string>): Promise<LoadResult> {
  await load(label, url, headers, WARM_UP_S);
  const result = await load(label, url, headers, DURATION_S);
  console.error(`${label}: ${result.requestsPerSecond} req/s, p99 ${result.p99Ms} ms (${result.requests} requests, ${result.errors} errors or timeouts)`);
  return result;
}

async function main(): Promise<void> {
  const server = await startBenchServer();
  try {
    const session = await signIn(server.baseUrl, 'partner@example.org', DEMO_PASSWORD);
    const headers = { cookie: session.cookieHeader };
    const audits = z.array(z.object({ id: z.number() })).parse(await (await fetch(`${server.baseUrl}/api/audits`, { headers })).json());
    if (audits.length === 0) throw new Error('The demo practice has no audit.');
    const resultsPath = `/api/audits/${audits[0].id}/results`;

    const floorBefore = await measure('floor /bench/hello (before)', `${server.baseUrl}/bench/hello`, {});
    const cases = await measure('GET /api/cases?pageSize=50', `${server.baseUrl}/api/cases?pageSize=50`, headers);
    const results = await measure(`GET ${resultsPath}`, `${server.baseUrl}${resultsPath}`, headers);
    // For the reader: the cheapest signed-in call, i.e. what the shared middleware costs on its own.
    const signedIn = await measure('GET /api/auth/me (signed-in baseline)', `${server.baseUrl}/api/auth/me`, headers);
    const floorAfter = await measure('floor /bench/hello (after)', `${server.baseUrl}/bench/hello`, {});
    const floor = Math.round((floorBefore.requestsPerSecond + floorAfter.requestsPerSecond) / 2);
    const floorP99Ms = Math.max(floorBefore.p99Ms, floorAfter.p99Ms);
    const serverPeakRssMb = processPeakRssMb(server.pid);
    const common = {
      floorBefore: floorBefore.requestsPerSecond,
      floorAfter: floorAfter.requestsPerSecond,
      floorP99Ms,
      signedInBaseline: signedIn.requestsPerSecond,
      signedInBaselineRatio: ratioOf(signedIn.requestsPerSecond, floor),
      connections: CONNECTIONS,
      durationS: DURATION_S,
      serverPeakRssMb,
    };

    const casesRatio = ratioOf(cases.requestsPerSecond, floor);
    printBenchLine({
      name: 'api-throughput',
      endpoint: 'GET /api/cases?pageSize=50',
      value: cases.requestsPerSecond,
      floor,
      ratio: casesRatio,
      goal: 0.35,
      unit: 'req/s',
      met: casesRatio !== null && casesRatio >= 0.35 && cases.p99Ms <= 50 && cases.errors === 0,
      criteria: 'ratio >= 0.35 of the floor req/s and p99 <= 50 ms',
      p99Ms: cases.p99Ms,
      errors: cases.errors,
      ...common,
    });
    printBenchLine({
      name: 'api-throughput',
      endpoint: 'GET /api/audits/:id/results',
      // The goal is a latency, so value, floor and ratio are p99s here (the floor's p99 beside it).
      value: results.p99Ms,
      floor: floorP99Ms,
      ratio: ratioOf(results.p99Ms, floorP99Ms),
      goal: 150,
      unit: 'ms (p99)',
      met: results.p99Ms <= 150 && results.errors === 0,
      criteria: 'p99 <= 150 ms (unchanged results served from the cache)',
      requestsPerSecond: results.requestsPerSecond,
      requestsRatio: ratioOf(results.requestsPerSecond, floor),
      p99Ms: results.p99Ms,
      errors: results.errors,
      ...common,
    });
  } finally {
    await server.stop();
  }
}

await main();
