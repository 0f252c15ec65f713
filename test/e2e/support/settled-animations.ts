import type { Page } from 'playwright-core';

/**
 * Waits until every finite animation and transition running on the page has ended (a message
 * fading in under a field, a button's ripple), so a screenshot shows the state a person sees a
 * moment later rather than a half-faded frame. Endless ones (spinners, progress bars) are left
 * alone, and one cancelled on the way counts as ended.
 */
export async function waitForAnimationsToSettle(page: Page): Promise<void> {
  await page.evaluate(async () => {
    const finite = document.getAnimations().filter((animation) => animation.effect?.getComputedTiming().endTime !== Infinity);
    await Promise.all(finite.map((animation) => animation.finished.catch(() => undefined)));
  });
}
