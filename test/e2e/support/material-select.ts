import type { Page } from 'playwright-core';

/**
 * Opens a Material select from the keyboard and picks an option with the mouse (the floating
 * label covers the select for a pointer, and the option list is an overlay). Waits for the
 * select's own option list to open and, after the pick, to close.
 */
export async function choose(page: Page, label: string, option: string | RegExp): Promise<void> {
  const list = page.getByRole('listbox', { name: label });
  await page.getByRole('combobox', { name: label }).press('Enter');
  await list.waitFor();
  await list.getByRole('option', { name: option, exact: typeof option === 'string' }).click();
  await list.waitFor({ state: 'detached' });
}

/**
 * Opens a Material select from the keyboard (its floating label covers it for the mouse) and
 * clicks the matching option anywhere on the page, without waiting for the list to close.
 * Kept as the standalone e2e specs have always picked options; {@link choose} waits more.
 */
export async function chooseWithoutWaiting(page: Page, label: string, option: string | RegExp): Promise<void> {
  await page.getByRole('combobox', { name: label }).focus();
  await page.keyboard.press('Enter');
  await page.getByRole('option', { name: option, exact: typeof option === 'string' }).click();
}
