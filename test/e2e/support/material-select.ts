import type { Page } from 'playwright-core';

/** How long one press of Enter gets to open the select before it is pressed again. */
const OPEN_ATTEMPT_MS = 3_000;
/** Presses of Enter before giving up. */
const OPEN_ATTEMPTS = 3;

/**
 * Picks an option of a Material select, waiting at every step so the next one starts from a
 * settled page: for the select to be enabled, for it to open (from the keyboard: the floating
 * label covers it for a pointer), for its own option list (the overlay labelled like the select)
 * and the option in it, and, after the click, for the list to close. An open select is used as it is.
 *
 * @param label the select's label, as its accessible name contains it
 * @param option the option's accessible name: a string matches exactly, a RegExp as written
 */
export async function choose(page: Page, label: string, option: string | RegExp): Promise<void> {
  const select = page.getByRole('combobox', { name: label });
  const list = page.getByRole('listbox', { name: label });
  // A select still waiting for its options (or for an earlier choice) is aria-disabled and ignores Enter.
  await select.and(page.locator(':not([aria-disabled="true"])')).waitFor();
  const expanded = select.and(page.locator('[aria-expanded="true"]'));
  // A keypress landing while the page re-renders can be lost. Enter is pressed again only while
  // the select says it is closed: on an open select it would pick the highlighted option instead.
  for (let attempt = 1; (await expanded.count()) === 0; attempt++) {
    await select.press('Enter');
    const isOpen = await expanded.waitFor({ timeout: OPEN_ATTEMPT_MS }).then(
      () => true,
      () => false,
    );
    if (!isOpen && attempt === OPEN_ATTEMPTS) throw new Error(`The “${label}” select did not open after ${OPEN_ATTEMPTS} presses of Enter.`);
  }
  await list.waitFor();
  const choice = list.getByRole('option', { name: option, exact: typeof option === 'string' });
  await choice.waitFor();
  await choice.click();
  await list.waitFor({ state: 'detached' });
}
