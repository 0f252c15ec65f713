import type { BrowserContext, CDPSession, Page } from 'playwright-core';

/**
 * Slows uploads through Chromium's network emulation (DevTools protocol,
 * `Network.emulateNetworkConditions`), so a determinate progress bar has time to be seen.
 * Downloads stay at full speed. Returns a function that lifts the limit.
 */
export async function throttleUploads(context: BrowserContext, page: Page, bytesPerSecond: number): Promise<() => Promise<void>> {
  const session: CDPSession = await context.newCDPSession(page);
  await session.send('Network.enable');
  await session.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: bytesPerSecond });
  return async () => {
    await session.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });
    await session.detach();
  };
}

/**
 * Starts recording every value a progress bar with this accessible name shows (its
 * `aria-valuenow`, or null while indeterminate), from the moment it appears until it goes.
 * Read the record with {@link progressSeen}.
 */
export async function recordProgress(page: Page, label: string): Promise<void> {
  await page.evaluate((name) => {
    const seen: (number | null)[] = [];
    Object.assign(window, { tmProgressSeen: seen });
    const look = (): void => {
      const bar = document.querySelector(`[role="progressbar"][aria-label="${name}"]`);
      if (!bar) return;
      const now = bar.getAttribute('aria-valuenow');
      const value = now === null ? null : Number(now);
      if (seen.at(-1) !== value || seen.length === 0) seen.push(value);
    };
    new MutationObserver(look).observe(document.body, { subtree: true, childList: true, attributes: true, attributeFilter: ['aria-valuenow'] });
  }, label);
}

/** Every value recorded since {@link recordProgress}, in order. */
export function progressSeen(page: Page): Promise<(number | null)[]> {
  return page.evaluate(() => {
    const seen: unknown = Reflect.get(window, 'tmProgressSeen');
    return Array.isArray(seen) ? seen.map((value) => (typeof value === 'number' ? value : null)) : [];
  });
}
