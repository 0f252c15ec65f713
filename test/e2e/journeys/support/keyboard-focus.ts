import type { FileChooser, Page } from 'playwright-core';

/** Where keyboard focus is, as a person using a screen reader would hear it. */
export interface FocusedElement {
  /** The element's accessible name, roughly: aria-label, its label(s), or its text without hidden icons. */
  readonly name: string;
  /** Its role: the ARIA role, else the tag name (`input`, `a`, `button` …). */
  readonly role: string;
  /** The name of the nearest enclosing `role="group"` or dialog (a site row, a dialog), or ''. */
  readonly within: string;
}

/** What has keyboard focus now. */
export function focused(page: Page): Promise<FocusedElement> {
  return page.evaluate(() => {
    const element = document.activeElement;
    const words = (node: Element | null): string => {
      if (!node) return '';
      const copy = node.cloneNode(true);
      if (copy instanceof Element) copy.querySelectorAll('[aria-hidden="true"]').forEach((hidden) => hidden.remove());
      return (copy.textContent ?? '').replace(/\s+/g, ' ').trim();
    };
    const byIds = (ids: string | null): string =>
      (ids ?? '')
        .split(/\s+/)
        .filter(Boolean)
        .map((id) => words(document.getElementById(id)))
        .join(' ')
        .trim();
    if (!element || element === document.body) return { name: '', role: 'body', within: '' };
    const labels = element instanceof HTMLInputElement || element instanceof HTMLTextAreaElement ? Array.from(element.labels ?? []).map(words).join(' ') : '';
    const name = element.getAttribute('aria-label') ?? (byIds(element.getAttribute('aria-labelledby')) || labels || words(element));
    const group = element.closest('[role="group"], [role="dialog"]');
    const within = group ? (group.getAttribute('aria-label') ?? byIds(group.getAttribute('aria-labelledby'))) : '';
    return { name: name.replace(/\s+/g, ' ').trim(), role: element.getAttribute('role') ?? element.tagName.toLowerCase(), within: within.trim() };
  });
}

/**
 * Presses `key` until focus lands on an element whose name matches, at most `limit` times, and
 * returns every stop on the way (so a test can say the order made sense).
 *
 * @throws when the target is not reached within `limit` presses
 */
export async function pressUntilFocused(page: Page, key: 'Tab' | 'Shift+Tab', target: RegExp, limit = 40): Promise<FocusedElement[]> {
  const stops: FocusedElement[] = [];
  for (let count = 0; count < limit; count++) {
    await page.keyboard.press(key);
    const now = await focused(page);
    stops.push(now);
    if (target.test(now.name)) return stops;
  }
  throw new Error(`Focus never reached ${target} with ${key}; stops: ${stops.map((stop) => `${stop.role} "${stop.name}"`).join(' → ')}`);
}

/** Presses a key and says where focus went. */
export async function pressAndLook(page: Page, key: string): Promise<FocusedElement> {
  await page.keyboard.press(key);
  return focused(page);
}

/**
 * Presses Enter on the focused "choose a file" control and returns the file chooser it opens.
 * On a loaded machine the first press can reach the page before Chromium intercepts file
 * choosers, and the picker is then dropped unseen; the control keeps focus, so the press is
 * repeated (at most `attempts` times, `waitMs` each).
 */
export async function enterForFileChooser(page: Page, attempts = 3, waitMs = 10_000): Promise<FileChooser> {
  for (let attempt = 1; ; attempt++) {
    const chooser = page.waitForEvent('filechooser', { timeout: waitMs });
    await page.keyboard.press('Enter');
    try {
      return await chooser;
    } catch (error) {
      if (attempt >= attempts) throw error;
    }
  }
}
