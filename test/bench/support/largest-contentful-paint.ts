import type { Browser } from 'playwright-core';

/** Cookies to start a page load with (e.g. a signed-in session). */
export interface PageCookie {
  name: string;
  value: string;
}

/**
 * Runs in the page: the start time of the last LCP candidate, or null when none comes within a
 * second. A string, because the server's TypeScript settings carry no DOM types.
 */
const READ_LCP = `new Promise((resolve) => {
  new PerformanceObserver((list) => {
    const entries = list.getEntries();
    resolve(entries.length ? entries[entries.length - 1].startTime : null);
  }).observe({ type: 'largest-contentful-paint', buffered: true });
  setTimeout(() => resolve(null), 1000);
})`;

/** Time after the page settles during which a later, larger paint may still be reported. */
const SETTLE_MS = 500;

/**
 * Largest Contentful Paint of one cold page load, in ms since navigation start: a fresh browser
 * context (empty HTTP cache, only the given cookies), `goto` until the network is idle, then the
 * last `largest-contentful-paint` entry (PerformanceObserver, buffered). Throws when the page
 * reported none (nothing painted, or not the expected page: `expectPath` must match where the
 * load ended, so a redirect to the sign-in page is not mistaken for the page under test).
 */
export async function largestContentfulPaint(browser: Browser, url: string, options: { cookies?: PageCookie[]; expectPath: RegExp }): Promise<number> {
  const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
  try {
    if (options.cookies?.length) await context.addCookies(options.cookies.map((cookie) => ({ ...cookie, url })));
    const page = await context.newPage();
    await page.goto(url, { waitUntil: 'networkidle' });
    await page.waitForTimeout(SETTLE_MS);
    const landed = new URL(page.url()).pathname;
    if (!options.expectPath.test(landed)) throw new Error(`Expected to land on ${options.expectPath}, got ${landed}`);
    const lcp: unknown = await page.evaluate(READ_LCP);
    if (typeof lcp !== 'number') throw new Error(`No largest-contentful-paint entry for ${url}`);
    return lcp;
  } finally {
    await context.close();
  }
}
