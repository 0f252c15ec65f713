import type { Page } from 'playwright-core';
import { screenshotPath } from './browser';

/**
 * Screenshot of a page inside the shell. The shell scrolls its content in its own pane, so a
 * full-page screenshot would stop at the viewport; the viewport is stretched to the content's
 * height for the picture (the width, and so the layout, stays) and restored afterwards.
 */
export async function screenshotWholePage(page: Page, name: string): Promise<void> {
  const viewport = page.viewportSize();
  const pane = page.locator('mat-sidenav-content');
  const contentHeight = (await pane.count()) ? await pane.evaluate((element) => element.getBoundingClientRect().top + element.scrollHeight) : 0;
  if (viewport && contentHeight > viewport.height) {
    await page.setViewportSize({ width: viewport.width, height: Math.ceil(contentHeight) });
  }
  await page.screenshot({ path: screenshotPath(name), fullPage: true });
  if (viewport) {
    await page.setViewportSize(viewport);
  }
}
