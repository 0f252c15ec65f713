import type { Browser, BrowserContext, Page } from 'playwright-core';
import { launchBrowser, screenshotPath } from './support/browser';
import { startServer, type RunningServer } from './support/server';
import { choose } from './support/material-select';
import { watchProblems } from './support/page-problems';
import { signIn } from './support/sign-in';

/** The demo audit the seed creates (server/demo/seed-demo-audits.ts). */
const DEMO_AUDIT = 'Margin stability after aesthetic crown lengthening';
/** Patient codes as the demo practice writes them; governance must never meet one. */
const PATIENT_CODE = /HP-\d{4}/;

/** The live cohort count as shown ("12 cases · 9 patients · 20 sites"), once a count has arrived. */
async function cohortCount(page: Page): Promise<string> {
  const count = page.getByTestId('cohort-count');
  await count.waitFor();
  return (await count.innerText()).replace(/\s+/g, ' ').trim();
}

/** Waits until the count differs from `before` and no newer count is on its way. */
async function countChangedFrom(page: Page, before: string): Promise<string> {
  await page.waitForFunction(
    (previous) => {
      const status = document.querySelector('tm-cohort-builder [role="status"]');
      const count = document.querySelector('[data-testid="cohort-count"]');
      const text = count?.textContent?.replace(/\s+/g, ' ').trim();
      return !!text && text !== previous && !status?.classList.contains('busy');
    },
    before,
    { timeout: 15_000 },
  );
  return cohortCount(page);
}

/**
 * Screenshot of a page inside the shell. The shell scrolls its content in its own pane, so the
 * viewport is stretched to the content's height for the picture and restored afterwards.
 */
async function screenshotWhole(page: Page, name: string): Promise<void> {
  const viewport = page.viewportSize();
  const pane = page.locator('mat-sidenav-content');
  const height = (await pane.count()) ? await pane.evaluate((element) => element.getBoundingClientRect().top + element.scrollHeight) : 0;
  if (viewport && height > viewport.height) await page.setViewportSize({ width: viewport.width, height: Math.ceil(height) });
  await page.screenshot({ path: screenshotPath(name), fullPage: true });
  if (viewport) await page.setViewportSize(viewport);
}

/** Opens the Results area and waits for the results board to draw at least one chart. */
async function openResults(page: Page): Promise<string[]> {
  await page.getByRole('tab', { name: 'Results' }).click();
  await page.waitForURL(/area=results/);
  await page.locator('figure canvas').first().waitFor({ timeout: 30_000 });
  return (await page.locator('figure figcaption').allInnerTexts()).map((text) => text.replace(/\s+/g, ' ').trim());
}

async function openDemoAudit(page: Page): Promise<void> {
  await page.getByRole('link', { name: 'Audits' }).click();
  await page.getByRole('link', { name: DEMO_AUDIT }).click();
  await page.getByRole('heading', { level: 1, name: DEMO_AUDIT }).waitFor();
}

describe('audits journey in Chromium', () => {
  let server: RunningServer;
  let browser: Browser;
  let context: BrowserContext;

  beforeAll(async () => {
    server = await startServer();
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });
  afterEach(async () => {
    await context?.close();
  });

  it('the audit lead defines an audit with a cohort and two standards, then sees its charts', async () => {
    context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await context.newPage();
    const problems = watchProblems(page);
    await signIn(page, server.baseUrl, 'lead@example.org');

    await page.getByRole('link', { name: 'Audits' }).click();
    await page.getByRole('link', { name: DEMO_AUDIT }).waitFor();
    await screenshotWhole(page, 'audit-list');
    await page.getByRole('link', { name: 'New audit' }).click();
    await page.waitForURL(/\/audits\/new$/);

    await page.getByLabel('Title').fill('Upper front margins after aesthetic surgery');
    await page.getByLabel('Why this audit').fill('Checks that the new margin holds in the smile zone.');
    // A new audit starts on the practice schedule, whose intervals are listed under it.
    await expect(page.getByRole('combobox', { name: 'Recall schedule' }).innerText()).resolves.toMatch(/Practice schedule/);
    await expect(page.getByRole('list', { name: 'Recall intervals of the chosen schedule' }).innerText()).resolves.toContain('6 months');

    // Each chip narrows the cohort, and the live count follows.
    const everyone = await cohortCount(page);
    await page.getByRole('option', { name: /Upper front/ }).click();
    const upperFront = await countChangedFrom(page, everyone);
    await page.getByRole('option', { name: /Excess gingival display/ }).click();
    const aesthetic = await countChangedFrom(page, upperFront);
    const cases = (text: string): number => Number(/^(\d+) case/.exec(text)?.[1]);
    expect(cases(upperFront)).toBeLessThan(cases(everyone));
    expect(cases(aesthetic)).toBeLessThan(cases(upperFront));
    expect(cases(aesthetic)).toBeGreaterThan(0);
    await screenshotWhole(page, 'audit-scope');

    await page.getByRole('button', { name: 'Create audit' }).click();
    await page.waitForURL(/\/audits\/\d+\?area=criteria$/);

    const standards = [
      { criterion: 'Mean rebound at 6 months is 1.0 mm or less', measure: 'Mean rebound at an interval', target: '1' },
      { criterion: 'At least 85% of cases are seen at 6 months', measure: 'Recall completion at an interval', target: '85' },
    ];
    for (const standard of standards) {
      await page.getByRole('button', { name: 'Add standard' }).click();
      const dialog = page.getByRole('dialog');
      await dialog.getByLabel('Criterion').fill(standard.criterion);
      await choose(page, 'Measure', standard.measure);
      await choose(page, 'Recall interval', '6 months');
      await dialog.getByLabel('Target').fill(standard.target);
      await dialog.getByLabel('Evidence source').fill('Practice standard');
      await dialog.getByRole('button', { name: 'Add standard' }).click();
      await dialog.waitFor({ state: 'detached' });
      await page.getByRole('cell', { name: standard.criterion }).waitFor();
    }
    // Each standard shows its latest result with a verdict in words.
    await page.locator('tm-criteria-table tm-verdict-badge').nth(1).waitFor();
    await screenshotWhole(page, 'audit-criteria');

    const captions = await openResults(page);
    for (const title of ['Margin drift by interval', 'Complications by operator', 'Recall completion']) {
      expect(captions.some((caption) => caption.startsWith(title))).toBe(true);
    }
    await screenshotWhole(page, 'audit-results-lead');
    expect(problems).toEqual([]);
  });

  it('the audit lead follows the demo audit’s cycles, action plan and re-audit comparison, also on a tablet', async () => {
    context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await context.newPage();
    const problems = watchProblems(page);
    await signIn(page, server.baseUrl, 'lead@example.org');
    await openDemoAudit(page);

    await page.getByRole('tab', { name: 'Cycles & actions' }).click();
    await page.waitForURL(/area=cycles/);
    const cycles = page.locator('tm-cycles-panel li.cycle');
    await cycles.nth(1).waitFor();
    await expect(cycles.count()).resolves.toBe(2);
    // The reported first cycle moves only on to "Closed"; the gathering re-audit only to weighing.
    await expect(cycles.nth(0).getByRole('group').getByRole('button', { name: 'Close the cycle' }).count()).resolves.toBe(1);
    await expect(cycles.nth(1).getByRole('button', { name: 'Start weighing results' }).count()).resolves.toBe(1);
    await expect(cycles.nth(0).innerText()).resolves.toMatch(/Frozen/);
    const comparison = page.getByRole('table', { name: 'Cycle 2 against cycle 1' });
    await comparison.waitFor();
    await expect(comparison.innerText()).resolves.toMatch(/(Beyond|Within) chance|Not tested/);
    await page.getByText('One operator sits near the upper warning limit').waitFor();
    await screenshotWhole(page, 'audit-cycles');

    expect(problems).toEqual([]);

    // The same pages on a tablet held upright: the menu folds away and nothing needs sideways scrolling.
    const tablet = await context.newPage();
    await tablet.setViewportSize({ width: 820, height: 1180 });
    await tablet.goto(`${page.url().replace(/\?.*$/, '')}?area=cycles`);
    await tablet.getByRole('table', { name: 'Cycle 2 against cycle 1' }).waitFor();
    await screenshotWhole(tablet, 'audit-cycles-tablet');
    await tablet.getByRole('tab', { name: 'Scope' }).click();
    await tablet.getByTestId('cohort-count').waitFor();
    await screenshotWhole(tablet, 'audit-scope-tablet');
    await tablet.getByRole('tab', { name: 'Criteria' }).click();
    await tablet.locator('tm-criteria-table tm-verdict-badge').first().waitFor();
    await screenshotWhole(tablet, 'audit-criteria-tablet');
    const overflow = await tablet.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
  });

  it('a partner opens the demo audit’s results and finds the operator funnel', async () => {
    context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await context.newPage();
    const problems = watchProblems(page);
    await signIn(page, server.baseUrl, 'partner@example.org');
    await openDemoAudit(page);
    // Partners read: no way to change the scope, standards or cycles.
    await expect(page.getByRole('button', { name: /Save scope|Add standard|New cycle/ }).count()).resolves.toBe(0);

    const captions = await openResults(page);
    expect(captions.some((caption) => caption.startsWith('Complications by operator'))).toBe(true);
    await page.locator('figure', { has: page.locator('figcaption', { hasText: /^Complications by operator/ }) }).scrollIntoViewIfNeeded();
    await screenshotWhole(page, 'audit-results-partner');
    expect(problems).toEqual([]);
  });

  it('a governance member reads the demo audit without meeting a patient code', async () => {
    context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await context.newPage();
    const problems = watchProblems(page);
    await signIn(page, server.baseUrl, 'governance@example.org');
    await openDemoAudit(page);
    await expect(page.getByRole('button', { name: /Save scope|Add standard|New cycle/ }).count()).resolves.toBe(0);

    await openResults(page);
    await screenshotWhole(page, 'audit-results-governance');
    for (const area of ['Results', 'Scope', 'Criteria', 'Cycles & actions']) {
      await page.getByRole('tab', { name: area }).click();
      await page.waitForTimeout(500);
      expect(await page.evaluate(() => document.body.innerText)).not.toMatch(PATIENT_CODE);
    }
    expect(problems).toEqual([]);
  });
});
