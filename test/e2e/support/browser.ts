import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { chromium, type Browser } from 'playwright-core';

/** Where screenshots land (git-ignored). */
export const RESULTS_DIR = path.resolve('test-results');

/** Debian's Chromium, headless, with the flags this closed network needs. Never downloads a browser. */
export async function launchBrowser(): Promise<Browser> {
  mkdirSync(RESULTS_DIR, { recursive: true });
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
}

/** Path for a named screenshot. */
export function screenshotPath(name: string): string {
  return path.join(RESULTS_DIR, `${name}.png`);
}
