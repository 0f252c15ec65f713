import type { Page } from 'playwright-core';
import { screenshotWholePage } from '../support/whole-page-screenshot';
import { DEMO_ACCOUNTS, signIn } from '../support/sign-in';
import { choose } from '../support/material-select';
import { watchProblems } from '../support/page-problems';
import { newJourneyContext, pictureOnFailure, squash, type JourneyWorld } from './support/journey-kit';

/** The live cohort count ("12 cases · 9 patients · 20 sites") once one has arrived, differs from `previous`, and no newer one is on its way. */
async function settledCount(page: Page, previous: string | null): Promise<string> {
  const status = page.getByRole('status').filter({ has: page.getByTestId('cohort-count') });
  await page.waitForFunction(
    ({ before }) => {
      const count = document.querySelector('[data-testid="cohort-count"]');
      const text = count?.textContent?.replace(/\s+/g, ' ').trim();
      // While a newer count is on its way the status says "updating…".
      return !!text && text !== before && !/updating|Counting/.test(count?.parentElement?.textContent ?? '');
    },
    { before: previous },
  );
  return squash(await status.getByTestId('cohort-count').innerText());
}

const casesIn = (count: string): number => Number(/^(\d+) case/.exec(count)?.[1]);

/**
 * Journey 1: the audit lead defines a new audit — its cohort, a recall schedule of their own and
 * two standards — and opens its results: charts drawn, and each chart's numbers a click away.
 */
export async function auditLeadJourney(world: JourneyWorld): Promise<void> {
  const context = await newJourneyContext(world);
  const page = await context.newPage();
  const problems = watchProblems(page);
  try {
    // Step 1: the audit lead signs in and starts a new audit from the audit list.
    await signIn(page, world.server.baseUrl, DEMO_ACCOUNTS.audit_lead);
    await page.getByRole('navigation', { name: 'Main navigation' }).getByRole('link', { name: 'Audits' }).click();
    await page.getByRole('link', { name: 'New audit' }).click();
    await page.waitForURL(/\/audits\/new$/);

    // Step 2: what the audit is and why.
    await page.getByLabel('Title').fill('Smile-zone margins after aesthetic crown lengthening');
    await page.getByLabel('Why this audit').fill('Do upper front margins placed for a balanced smile stay where they were placed?');

    // Step 3: the cohort; each filter narrows it and the live count follows.
    const everyone = await settledCount(page, null);
    await page.getByRole('option', { name: /Upper front/ }).click();
    const upperFront = await settledCount(page, everyone);
    await page.getByRole('option', { name: /Excess gingival display/ }).click();
    const aesthetic = await settledCount(page, upperFront);
    expect(casesIn(upperFront)).toBeLessThan(casesIn(everyone));
    expect(casesIn(aesthetic)).toBeLessThan(casesIn(upperFront));
    expect(casesIn(aesthetic)).toBeGreaterThan(0);

    // Step 4: a recall schedule of its own: the early and six-month recalls, six months a little wider.
    await page.getByRole('button', { name: 'New schedule' }).click();
    const dialog = page.getByRole('dialog', { name: 'New recall schedule' });
    await dialog.getByLabel('Schedule name').fill('Early healing and six months');
    for (const interval of ['3 months', '12 months']) await dialog.getByRole('group', { name: interval }).getByRole('checkbox').uncheck();
    await expect(dialog.getByRole('group', { name: '12 months' }).getByLabel('Days after').isDisabled()).resolves.toBe(true);
    await dialog.getByRole('group', { name: '6 months' }).getByLabel('Days after').fill('45');
    await dialog.screenshot({ path: 'test-results/journey-1-new-schedule.png' });
    await dialog.getByRole('button', { name: 'Save schedule' }).click();
    await dialog.waitFor({ state: 'detached' });
    await expect(page.getByRole('combobox', { name: 'Recall schedule' }).innerText()).resolves.toBe('Early healing and six months');
    const intervals = await page.getByRole('list', { name: 'Recall intervals of the chosen schedule' }).getByRole('listitem').allInnerTexts();
    expect(intervals.map(squash)).toEqual([expect.stringMatching(/2 weeks/), expect.stringMatching(/6 weeks/), expect.stringMatching(/6 months/)]);
    expect(squash(intervals[2] ?? '')).toMatch(/45/);
    await screenshotWholePage(page, 'journey-1-scope');

    // Step 5: create it; the audit opens on its criteria.
    await page.getByRole('button', { name: 'Create audit' }).click();
    await page.waitForURL(/\/audits\/\d+\?area=criteria$/);

    // Step 6: two standards, at intervals of the new schedule only.
    const standards = [
      { criterion: 'Mean rebound at 6 months is 1.0 mm or less', measure: 'Mean rebound at an interval', target: '1' },
      { criterion: 'At least 85% of cases are seen at 6 months', measure: 'Recall completion at an interval', target: '85' },
    ];
    for (const standard of standards) {
      await page.getByRole('button', { name: 'Add standard' }).click();
      const standardDialog = page.getByRole('dialog');
      await standardDialog.getByLabel('Criterion').fill(standard.criterion);
      await choose(page, 'Measure', standard.measure);
      await page.getByRole('combobox', { name: 'Recall interval' }).focus();
      await page.keyboard.press('Enter');
      await expect(page.getByRole('listbox').getByRole('option').allInnerTexts()).resolves.toEqual(['2 weeks', '6 weeks', '6 months']);
      await page.getByRole('option', { name: '6 months', exact: true }).click();
      await standardDialog.getByLabel('Target').fill(standard.target);
      await standardDialog.getByLabel('Evidence source').fill('Practice standard, agreed at the partners’ meeting');
      await standardDialog.getByRole('button', { name: 'Add standard' }).click();
      await standardDialog.waitFor({ state: 'detached' });
      await page.getByRole('cell', { name: standard.criterion }).waitFor();
    }
    await expect(page.getByRole('row').filter({ hasText: /Mean rebound at 6 months/ }).innerText()).resolves.toMatch(/Met|Not met|Inconclusive|No data/);
    await screenshotWholePage(page, 'journey-1-criteria');

    // Step 7: the results board: every chart drawn, the interval chips those of the new schedule.
    await page.getByRole('tab', { name: 'Results' }).click();
    await page.waitForURL(/area=results/);
    const drift = page.getByRole('figure', { name: 'Margin drift by interval' });
    await drift.locator('canvas').waitFor();
    for (const title of ['Margin drift by interval', 'Rebound spread', 'Papilla fill by interval', 'Complications by operator', 'Recall completion', 'Time to relapse']) {
      const figure = page.getByRole('figure', { name: title });
      await figure.locator('canvas').waitFor();
      expect(await figure.locator('canvas').evaluate((canvas: HTMLCanvasElement) => canvas.width * canvas.height)).toBeGreaterThan(0);
    }
    const chips = await page.getByRole('listbox', { name: 'Interval' }).getByRole('option').allInnerTexts();
    expect(chips.map(squash)).toEqual(['2 weeks', '6 weeks', '6 months']);

    // Step 8: the chart's numbers: the toggle shows a table, says it is open, and hides it again.
    const toggle = drift.getByRole('button', { name: 'Show the numbers' });
    await toggle.click();
    const numbers = page.getByRole('region', { name: 'Margin drift by interval: the numbers' });
    await numbers.getByRole('table').waitFor();
    expect(await numbers.getByRole('row').count()).toBeGreaterThan(1);
    await expect(numbers.getByRole('columnheader').first().innerText()).resolves.toBeTruthy();
    await expect(drift.getByRole('button', { name: 'Hide the numbers' }).getAttribute('aria-expanded')).resolves.toBe('true');
    await screenshotWholePage(page, 'journey-1-results');
    await drift.getByRole('button', { name: 'Hide the numbers' }).click();
    await numbers.waitFor({ state: 'hidden' });
    await expect(drift.getByRole('button', { name: 'Show the numbers' }).getAttribute('aria-expanded')).resolves.toBe('false');
    expect(problems).toEqual([]);
  } catch (error) {
    await pictureOnFailure(page, 'journey-1', error);
  } finally {
    await context.close();
  }
}
