/**
 * Benchmark: what the browser must fetch and paint before the Today page is useful.
 *
 * 1. Initial JavaScript of the production build (built first with scripts/ensure-client-build.ts
 *    only if dist/ is older than its sources): the files dist/tidemark/browser/index.html names in
 *    `<script src>` and `<link rel="modulepreload">`, plus whatever those import statically (the
 *    builder writes at most ten preload hints; the rest is fetched before start-up all the same),
 *    never dynamic `import()` chunks. Each file gzipped with node:zlib at level 9. Goal: ≤ 300 kB
 *    (1 kB = 1000 bytes), with Chart.js not among them (marker: an error message only Chart.js has).
 * 2. Largest Contentful Paint of the Today page in headless Chromium (playwright-core,
 *    /usr/bin/chromium): the bench server (real app + built client, demo practice) in a child
 *    process; signed in once as the demo clinician over HTTP, the session cookies handed to a fresh
 *    browser context (empty cache) per load of /today. Floor: a trivial static page served by the
 *    same process (/bench/static). One warm-up of each, then 5 loads each, alternating; medians.
 *    Goal: ≤ 1000 ms absolute (the ratio to the floor is printed for context).
 * Prints two lines named "client-bundle" (metric "initial-js-gzip" and "lcp-today").
 */
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { DEMO_PASSWORD } from '../../server/demo/demo-accounts';
import { launchBrowser } from '../e2e/support/browser';
import { printBenchLine, ratioOf } from './support/bench-line';
import { startBenchServer } from './support/bench-server-process';
import { initialScripts } from './support/initial-scripts';
import { largestContentfulPaint } from './support/largest-contentful-paint';
import { median } from './support/median';
import { signIn } from './support/signed-in-session';

const BUNDLE_GOAL_KB = 300;
const LCP_GOAL_MS = 1000;
const RUNS = 5;
/** Thrown by Chart.js when a canvas is reused; present in any build that bundles Chart.js. */
const CHART_JS_MARKER = 'Canvas is already in use';

const root = path.resolve(path.dirname(new URL(import.meta.url).pathname), '..', '..');
const browserDir = path.join(root, 'dist', 'tidemark', 'browser');

function ensureClientBuild(): void {
  // Its progress goes to stderr: stdout carries only bench lines.
  const result = spawnSync(process.execPath, ['--import', 'tsx', path.join(root, 'scripts', 'ensure-client-build.ts')], { cwd: root, stdio: ['ignore', 2, 2] });
  if (result.status !== 0) throw new Error(`The client build failed (exit ${result.status}).`);
}

function measureBundle(): void {
  const scripts = initialScripts(browserDir);
  const files = [...scripts.listed, ...scripts.unlisted];
  const hasCharts = files.some((file) => readFileSync(path.join(browserDir, file), 'utf8').includes(CHART_JS_MARKER));
  const value = Math.round(scripts.gzipBytes / 100) / 10;
  printBenchLine({
    name: 'client-bundle',
    metric: 'initial-js-gzip',
    value,
    floor: null,
    ratio: null,
    goal: BUNDLE_GOAL_KB,
    unit: 'kB',
    met: value <= BUNDLE_GOAL_KB && !hasCharts,
    criteria: 'initial JavaScript <= 300 kB gzip (node:zlib level 9, 1 kB = 1000 bytes), Chart.js lazy',
    rawKb: Math.round(scripts.rawBytes / 100) / 10,
    files: files.length,
    listedInIndexHtml: scripts.listed.length,
    chartsInInitial: hasCharts,
  });
}

async function measurePaint(): Promise<void> {
  const server = await startBenchServer();
  const browser = await launchBrowser();
  try {
    const session = await signIn(server.baseUrl, 'clinician@example.org', DEMO_PASSWORD);
    const cookies = [...session.cookies].map(([name, value]) => ({ name, value }));
    const today = () => largestContentfulPaint(browser, `${server.baseUrl}/today`, { cookies, expectPath: /^\/today/ });
    const floor = () => largestContentfulPaint(browser, `${server.baseUrl}/bench/static`, { expectPath: /^\/bench\/static$/ });
    await floor();
    await today();
    const todayMs: number[] = [];
    const floorMs: number[] = [];
    for (let run = 0; run < RUNS; run++) {
      floorMs.push(await floor());
      todayMs.push(await today());
      console.error(`run ${run}: floor ${Math.round(floorMs[run])} ms, Today ${Math.round(todayMs[run])} ms`);
    }
    const value = Math.round(median(todayMs));
    const floorValue = Math.round(median(floorMs));
    printBenchLine({
      name: 'client-bundle',
      metric: 'lcp-today',
      value,
      floor: floorValue,
      ratio: ratioOf(value, floorValue),
      goal: LCP_GOAL_MS,
      unit: 'ms',
      met: value <= LCP_GOAL_MS,
      criteria: 'Largest Contentful Paint of /today <= 1000 ms (absolute; median of 5 cold loads)',
      runs: todayMs.map(Math.round),
      floorRuns: floorMs.map(Math.round),
    });
  } finally {
    await browser.close();
    await server.stop();
  }
}

ensureClientBuild();
measureBundle();
await measurePaint();
