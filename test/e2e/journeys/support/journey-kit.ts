import path from 'node:path';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { RESULTS_DIR } from '../../support/browser';
import type { RunningServer } from '../../support/server';

/** What every journey runs against: one server with the demo practice, one browser. */
export interface JourneyWorld {
  readonly server: RunningServer;
  readonly browser: Browser;
}

/** The demo audit the seed creates, with a reported (frozen) first cycle (server/demo/seed-demo-audits.ts). */
export const DEMO_AUDIT = 'Margin stability after aesthetic crown lengthening';

/** A busy machine (scrypt sign-in, lazy chunks, chart drawing): waits get a minute. */
export const PATIENT_WAIT_MS = 60_000;

/** A fresh context (own cookies) with the patient default timeout. */
export async function newJourneyContext(world: JourneyWorld, options: Parameters<Browser['newContext']>[0] = {}): Promise<BrowserContext> {
  const context = await world.browser.newContext({ viewport: { width: 1280, height: 800 }, ...options });
  context.setDefaultTimeout(PATIENT_WAIT_MS);
  return context;
}

/** Saves a picture of the page as it stood when a journey failed, then lets the failure through. */
export async function pictureOnFailure(page: Page, name: string, error: unknown): Promise<never> {
  await page.screenshot({ path: path.join(RESULTS_DIR, `${name}-failure.png`), fullPage: true }).catch(() => undefined);
  throw error;
}

/** Text with runs of white space made single, for comparing what a table shows. */
export function squash(text: string): string {
  return text.replace(/\s+/g, ' ').trim();
}
