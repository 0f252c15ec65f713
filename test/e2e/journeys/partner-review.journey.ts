import type { Page } from 'playwright-core';
import { screenshotWholePage } from '../support/whole-page-screenshot';
import { DEMO_ACCOUNTS, signIn } from '../support/sign-in';
import { choose } from '../support/material-select';
import { watchProblems } from '../support/page-problems';
import { DEMO_AUDIT, newJourneyContext, pictureOnFailure, squash, type JourneyWorld } from './support/journey-kit';

/** What the results show at one moment: the outcome summary's row and the margin-drift numbers. */
interface ShownFigures {
  /** The outcome summary's row at the chosen interval: n sites and patients, mean rebound with CI, shares. */
  readonly summaryRow: string;
  /** The margin-drift chart's table of numbers. */
  readonly driftNumbers: string;
  readonly sites: number;
}

async function shownFigures(page: Page): Promise<ShownFigures> {
  const summary = page.getByRole('region', { name: 'Outcome summary' });
  const summaryRow = squash(await summary.getByRole('row').nth(1).innerText());
  const driftNumbers = squash(await page.getByRole('region', { name: 'Margin drift by interval: the numbers' }).innerText());
  return { summaryRow, driftNumbers, sites: Number(/(\d+) sites?/.exec(summaryRow)?.[1]) };
}

/** Waits until the board has answered a change of view: not busy, and the summary row no longer `previous`. */
async function figuresAfterChange(page: Page, previous: ShownFigures): Promise<ShownFigures> {
  await page.waitForFunction(
    ({ before }) => {
      const board = document.querySelector('[aria-labelledby="results-board-heading"]');
      const row = Array.from(document.querySelectorAll('[aria-labelledby="results-summary-heading"] tr'))[1];
      return board?.getAttribute('aria-busy') === 'false' && !!row && row.textContent?.replace(/\s+/g, ' ').trim() !== before;
    },
    { before: previous.summaryRow },
  );
  return shownFigures(page);
}

/**
 * Journey 3: a partner reviews rebound on the demo audit's charts, narrows them to thin gingival
 * phenotype and then to one operator, sees every figure follow, and leaves a review note.
 */
export async function partnerReviewJourney(world: JourneyWorld): Promise<void> {
  const context = await newJourneyContext(world);
  const page = await context.newPage();
  const problems = watchProblems(page);
  try {
    // Step 1: the partner signs in and opens the demo audit's results.
    await signIn(page, world.server.baseUrl, DEMO_ACCOUNTS.partner);
    await page.getByRole('navigation', { name: 'Main navigation' }).getByRole('link', { name: 'Audits' }).click();
    await page.getByRole('link', { name: DEMO_AUDIT }).click();
    await page.getByRole('heading', { level: 1, name: DEMO_AUDIT }).waitFor();
    await page.getByRole('tab', { name: 'Results' }).click();
    await page.waitForURL(/area=results/);

    // Step 2: rebound on the charts: margin drift, its spread, and month by month.
    for (const title of ['Margin drift by interval', 'Rebound spread', 'Monthly relapse control']) {
      await page.getByRole('figure', { name: title }).locator('canvas').waitFor();
    }
    await expect(page.getByRole('figure', { name: 'Rebound spread' }).innerText()).resolves.toMatch(/rebound/i);
    const drift = page.getByRole('figure', { name: 'Margin drift by interval' });
    await drift.getByRole('button', { name: 'Show the numbers' }).click();
    await page.getByRole('region', { name: 'Margin drift by interval: the numbers' }).getByRole('table').waitFor();
    await page.getByRole('region', { name: 'Outcome summary' }).getByRole('row').nth(1).waitFor();
    const whole = await shownFigures(page);
    expect(whole.summaryRow).toMatch(/\d+\.\d+ mm/);
    await screenshotWholePage(page, 'journey-3-results-whole-cohort');

    // Step 3: narrow to thin gingival phenotype: the address, the summary and the drift numbers all follow.
    await choose(page, 'Gingival phenotype', 'Thin (≤ 1 mm)');
    await page.waitForURL(/phenotype=thin/);
    const thin = await figuresAfterChange(page, whole);
    expect(thin.sites).toBeLessThan(whole.sites);
    expect(thin.driftNumbers).not.toBe(whole.driftNumbers);

    // Step 4: and to one operator on top: fewer sites again, different figures again.
    await choose(page, 'Operator', /Quayle/);
    await page.waitForURL(/operator=\d+/);
    const thinQuayle = await figuresAfterChange(page, thin);
    expect(thinQuayle.sites).toBeLessThan(thin.sites);
    expect(thinQuayle.sites).toBeGreaterThan(0);
    expect(thinQuayle.driftNumbers).not.toBe(thin.driftNumbers);
    await page.getByText('The operator funnel still compares every operator').waitFor();
    await screenshotWholePage(page, 'journey-3-results-thin-one-operator');

    // Step 5: the narrowed view is an address a colleague can open: reloading shows the same figures.
    await page.reload();
    await page.getByRole('figure', { name: 'Margin drift by interval' }).getByRole('button', { name: 'Show the numbers' }).click();
    await page.getByRole('region', { name: 'Margin drift by interval: the numbers' }).getByRole('table').waitFor();
    await page.waitForFunction(() => document.querySelector('[aria-labelledby="results-board-heading"]')?.getAttribute('aria-busy') === 'false');
    await expect(page.getByRole('combobox', { name: 'Gingival phenotype' }).innerText()).resolves.toBe('Thin (≤ 1 mm)');
    await expect(page.getByRole('combobox', { name: 'Operator' }).innerText()).resolves.toMatch(/Quayle/);
    expect((await shownFigures(page)).summaryRow).toBe(thinQuayle.summaryRow);

    // Step 6: a review note about the drift chart, which then heads the notes list.
    await page.getByRole('tab', { name: 'Cycles & actions' }).click();
    const notes = page.getByRole('region', { name: 'Review notes' });
    await notes.waitFor();
    await choose(page, 'About', 'Chart: margin drift by interval');
    const text = `Thin phenotype, Dr Quayle: ${thinQuayle.sites} sites at 6 months. Worth a look at the next partners’ meeting.`;
    await notes.getByLabel('Note').fill(text);
    await notes.getByRole('button', { name: 'Add note' }).click();
    const note = notes.getByRole('listitem').filter({ hasText: text });
    await note.waitFor();
    await expect(note.innerText()).resolves.toMatch(/Dr Pat Partner.*Chart: margin drift by interval/s);
    await expect(notes.getByRole('listitem').first().innerText()).resolves.toContain(text);
    await expect(notes.getByLabel('Note').inputValue()).resolves.toBe('');
    // The emptied field is ready for the next note, not marked as an error.
    await expect(notes.getByText('Write the note.').count()).resolves.toBe(0);
    await notes.scrollIntoViewIfNeeded();
    await screenshotWholePage(page, 'journey-3-review-note');
    expect(problems).toEqual([]);
  } catch (error) {
    await pictureOnFailure(page, 'journey-3', error);
  } finally {
    await context.close();
  }
}
