import type { Browser, BrowserContext, Page } from 'playwright-core';
import { launchBrowser } from './support/browser';
import { startServer, type RunningServer } from './support/server';
import { DEMO_ACCOUNTS, signIn } from './support/sign-in';

/*
 * What the browser keeps after a working session (OWASP ASVS 5.0 14.3.3: no sensitive data in
 * browser storage other than session tokens). Allowed: the HttpOnly session cookie, the readable
 * anti-forgery cookie (XSRF-TOKEN, STACK-NOTES 16) and the colour-scheme choice in localStorage
 * (src/app/core/theme/color-scheme.ts). Nothing else: no sessionStorage, IndexedDB, Cache Storage
 * or service worker, and no patient code or e-mail address in any value.
 */

/** The one localStorage key the client writes. */
const COLOR_SCHEME_KEY = 'tidemark.color-scheme';
/** Patient codes as the demo practice writes them (server/demo). */
const PATIENT_CODE = /HP-\d{4}/;

interface StorageSnapshot {
  local: Record<string, string>;
  session: Record<string, string>;
  indexedDb: string[];
  caches: string[];
  serviceWorkers: number;
}

/** Everything the page's origin holds, read inside the page. */
function storageOf(page: Page): Promise<StorageSnapshot> {
  return page.evaluate(async () => {
    const entries = (storage: Storage) => Object.fromEntries(Array.from({ length: storage.length }, (_, index) => storage.key(index) ?? '').map((key) => [key, storage.getItem(key) ?? '']));
    return {
      local: entries(localStorage),
      session: entries(sessionStorage),
      indexedDb: (await indexedDB.databases()).map((database) => database.name ?? ''),
      caches: await caches.keys(),
      serviceWorkers: (await navigator.serviceWorker.getRegistrations()).length,
    };
  });
}

/** Cookie names with their HttpOnly flag. */
async function cookiesOf(context: BrowserContext): Promise<Record<string, boolean>> {
  return Object.fromEntries((await context.cookies()).map((cookie) => [cookie.name, cookie.httpOnly]));
}

/** The session cookie's value, if the browser holds one. */
async function sessionCookieOf(context: BrowserContext): Promise<string | undefined> {
  return (await context.cookies()).find((cookie) => cookie.name === 'tm.sid')?.value;
}

describe('browser storage after a session (ASVS 5.0 14.3.3)', () => {
  let server: RunningServer;
  let browser: Browser;

  beforeAll(async () => {
    server = await startServer();
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });

  it('holds only the session cookie, the anti-forgery cookie and the colour scheme after working with cases and an audit, and not the signed-in session cookie after signing out', async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await context.newPage();
    await signIn(page, server.baseUrl, DEMO_ACCOUNTS.audit_lead);

    // Work with patient-level data: the case list, one case, an audit's results.
    await page.getByRole('navigation', { name: 'Main navigation' }).getByRole('link', { name: 'Cases' }).click();
    const firstCase = page.locator('a.code-link').first();
    await firstCase.waitFor();
    const shownCode = (await firstCase.innerText()).trim();
    expect(shownCode).toMatch(PATIENT_CODE);
    await firstCase.click();
    await page.waitForURL(/\/cases\/\d+$/);
    await page.getByRole('heading', { level: 1 }).waitFor();
    await page.getByRole('navigation', { name: 'Main navigation' }).getByRole('link', { name: 'Audits' }).click();
    await page.waitForURL(/\/audits/);
    await page.getByRole('button', { name: /Use (dark|light) theme/ }).click();

    const during = await storageOf(page);
    expect(Object.keys(during.local)).toEqual([COLOR_SCHEME_KEY]);
    expect(['dark', 'light']).toContain(during.local[COLOR_SCHEME_KEY]);
    expect(during.session).toEqual({});
    expect(during.indexedDb).toEqual([]);
    expect(during.caches).toEqual([]);
    expect(during.serviceWorkers).toBe(0);
    const kept = JSON.stringify(during);
    expect(kept).not.toContain(shownCode);
    expect(kept).not.toMatch(PATIENT_CODE);
    expect(kept).not.toContain('@example.org');
    expect(await cookiesOf(context)).toEqual({ 'tm.sid': true, 'XSRF-TOKEN': false });
    const signedInSession = await sessionCookieOf(context);

    await page.getByRole('button', { name: /Sign out/ }).click();
    await page.waitForURL(/\/sign-in/);
    const after = await storageOf(page);
    expect(Object.keys(after.local)).toEqual([COLOR_SCHEME_KEY]);
    expect(after.session).toEqual({});
    // The signed-in session's cookie is gone; the sign-in page may hold a fresh, anonymous one for its anti-forgery token (server/auth/csrf.ts).
    expect(await sessionCookieOf(context)).not.toBe(signedInSession);
    expect((await context.request.get(`${server.baseUrl}/api/auth/me`)).status()).toBe(401);
    await context.close();
  });
});
