import type { Browser, BrowserContext, Locator, Page } from 'playwright-core';
import type { CaseDetail, RecallDueList } from '@tidemark/shared';
import { launchBrowser } from './support/browser';
import { startServer, type RunningServer } from './support/server';
import { choose } from './support/material-select';
import { watchProblems } from './support/page-problems';
import { DEMO_ACCOUNTS, signIn } from './support/sign-in';
import { screenshotWholePage } from './support/whole-page-screenshot';

/** Reads a "10.0 mm" cell as a number (null for a dash). */
function millimetres(text: string): number | null {
  const match = /(\d+(?:\.\d+)?) mm/.exec(text);
  return match ? Number(match[1]) : null;
}

async function signInAsClinician(page: Page, baseUrl: string): Promise<void> {
  await signIn(page, baseUrl, DEMO_ACCOUNTS.clinician);
  await page.waitForURL(/\/today$/);
}

describe('recall entry journey in Chromium', () => {
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

  it('a clinician opens a due recall from Today, types every site by keyboard, saves, and finds it on the case page', async () => {
    context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await context.newPage();
    const problems = watchProblems(page);
    await signInAsClinician(page, server.baseUrl);

    // Of the recalls in window, take the one with the most teeth, so Tab has rows to cross;
    // then open it the way a person does, with its "Enter recall" button on Today.
    const due: RecallDueList = await (await page.request.get(`${server.baseUrl}/api/recalls/due`)).json();
    const busiest = [...due.inWindow].sort((a, b) => b.teeth.length - a.teeth.length)[0];
    expect(busiest).toBeDefined();
    const dueNow = page.getByRole('region', { name: /In window now/ });
    await dueNow.getByRole('link', { name: `Enter recall for ${busiest?.patientCode}, ${busiest?.intervalLabel}` }).click();
    await page.waitForURL(/\/cases\/\d+\/recall\/\w+$/);
    const [, caseId, intervalKey] = /\/cases\/(\d+)\/recall\/(\w+)$/.exec(page.url()) ?? [];

    await page.getByRole('heading', { level: 1, name: /recall ·/ }).waitFor();
    const rows = page.locator('tm-recall-site-row');
    const rowCount = await rows.count();
    expect(rowCount).toBeGreaterThan(0);

    // Keyboard only from the first REF→GM on: type, Tab along the row, on to the next row.
    await rows.first().getByLabel('REF→GM').focus();
    const typed: number[] = [];
    for (let index = 0; index < rowCount; index += 1) {
      const row: Locator = rows.nth(index);
      const readings = (await row.locator('.readings dd').allInnerTexts()).map(millimetres);
      const [baseline, postOp] = readings;
      // Half a millimetre of rebound where a post-op reading exists; a plausible gain otherwise.
      const refGm = postOp !== null && postOp !== undefined ? postOp - 0.5 : (baseline ?? 8) + 1;
      typed.push(refGm);
      await page.keyboard.type(String(refGm));
      if (index === 0 && postOp !== null && postOp !== undefined) {
        // The live outcome follows the keystrokes: post-op − typed = +0.5 mm.
        await row.locator('.outcome').getByText(/Rebound\s*\+0\.5 mm/).waitFor({ timeout: 5_000 });
      }
      await page.keyboard.press('Tab');
      await page.keyboard.type('2');
      await page.keyboard.press('Tab');
      if (index % 2 === 0) await page.keyboard.press('Space');
      await page.keyboard.press('Tab');
      await page.keyboard.type('3');
      if ((await row.locator('[data-field="papillaScore"]').count()) > 0) {
        await page.keyboard.press('Tab');
        await page.keyboard.type('3');
      }
      // Enter moves on like Tab and never saves.
      await page.keyboard.press('Enter');
    }
    expect(page.url()).toMatch(/\/recall\//);
    await screenshotWholePage(page, 'recall-entry');

    await page.getByRole('button', { name: /Save recall/ }).click();
    const landed = page.waitForURL(new RegExp(`/cases/${caseId}$`));
    // The confirm step appears only when a reading moved more than 3 mm since the last one.
    const confirm = page.getByRole('button', { name: /Readings are right/ });
    void confirm
      .waitFor({ timeout: 10_000 })
      .then(() => confirm.click())
      .catch(() => undefined);
    await landed;

    const saved: CaseDetail = await (await page.request.get(`${server.baseUrl}/api/cases/${caseId}`)).json();
    const visit = saved.visits.find((each) => each.intervalKey === intervalKey);
    expect(visit?.measurements).toHaveLength(rowCount);
    expect(visit?.measurements.map((measurement) => measurement.probingDepth)).toEqual(new Array(rowCount).fill(2));
    expect(visit?.measurements.map((measurement) => measurement.refGm).sort()).toEqual([...typed].sort());
    // The case page shows the interval as recorded, open for correction.
    await page.getByRole('link', { name: `Correct the ${visit?.intervalLabel} recall` }).waitFor();
    await page.waitForLoadState('networkidle');
    await screenshotWholePage(page, 'case-after-recall');
    expect(problems).toEqual([]);
  });

  it('lays the recall grid out for a 1024 × 768 tablet', async () => {
    context = await browser.newContext({ viewport: { width: 1024, height: 768 } });
    const page = await context.newPage();
    const problems = watchProblems(page);
    await signInAsClinician(page, server.baseUrl);
    await page.getByRole('region', { name: /In window now/ }).getByRole('link', { name: /Enter recall/ }).first().click();
    await page.waitForURL(/\/cases\/\d+\/recall\/\w+$/);
    const firstRow = page.locator('tm-recall-site-row').first();
    await firstRow.waitFor({ timeout: 15_000 }).catch(() => undefined);
    expect(problems).toEqual([]);
    await firstRow.getByLabel('REF→GM').fill('8.5');
    await screenshotWholePage(page, 'recall-entry-tablet');
    // Nothing runs off the side: the content pane needs no horizontal scrolling.
    const overflow = await page.locator('mat-sidenav-content').evaluate((pane) => pane.scrollWidth - pane.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
  });

  it('registers a new case through the stepper and lands on its case page', async () => {
    context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await context.newPage();
    const problems = watchProblems(page);
    await signInAsClinician(page, server.baseUrl);
    await page.goto(`${server.baseUrl}/cases/new`);

    const code = `E2E-${Date.now().toString(36).toUpperCase().slice(-6)}`;
    await page.getByLabel('Patient code').fill(code);
    await page.getByLabel('Birth year').fill('1981');
    await choose(page, 'Sex', 'Female');
    await choose(page, 'Smoking', 'Current smoker');
    await page.getByLabel('Cigarettes a day').fill('5');
    await choose(page, 'Diabetes', 'No diabetes');
    await choose(page, 'Gingival phenotype', /Thin/);
    await choose(page, 'Phenotype assessed by', 'Probe visible through the margin');
    await page.getByRole('button', { name: /Next: surgery plan/ }).click();

    await choose(page, 'Procedure', 'Apically positioned flap');
    await choose(page, 'Indication', /caries/);
    await choose(page, 'Instrument', 'Scalpel');
    await page.getByLabel('Hygiene phase completed').check();
    await page.getByRole('button', { name: /Next: teeth/ }).click();

    const tooth21 = page.getByRole('button', { name: '21, central incisor' });
    const pressed21 = page.locator('[aria-label="21, central incisor"][aria-pressed="true"]');
    await tooth21.click();
    // Change detection runs after the click resolves, so wait for the pressed state rather than read it once.
    // A click that lands while the stepper is still sliding in can be lost; after two quiet seconds, one more is safe.
    if (!(await pressed21.waitFor({ timeout: 2_000 }).then(() => true, () => false))) await tooth21.click();
    await pressed21.waitFor({ timeout: 5_000 });
    await expect(tooth21.getAttribute('aria-pressed')).resolves.toBe('true');
    await page.getByRole('group', { name: 'Sites on tooth 21' }).getByText('Mesial papilla').click();
    await page.getByRole('button', { name: /Next: baseline/ }).click();

    const cards = page.locator('tm-site-baseline-card');
    await cards.nth(1).waitFor();
    await expect(cards.count()).resolves.toBe(2);
    for (const [index, values] of [
      ['9', '3', '3', '1.5'],
      ['8', '3', '4', '1'],
    ].entries()) {
      const card = cards.nth(index);
      await card.getByLabel('Baseline REF→GM').fill(values[0] ?? '');
      await card.getByLabel('KT width').fill(values[1] ?? '');
      await card.getByLabel('Margin-to-crest').fill(values[2] ?? '');
      await card.getByLabel('Planned excision').fill(values[3] ?? '');
    }
    // 3 mm of keratinized tissue − 1.5 mm excision leaves 1.5 mm (< 2 mm guidance): shown, never blocking.
    await expect(cards.first().locator('tm-planning-check-panel').innerText()).resolves.toMatch(/keratinized tissue would remain/);
    await screenshotWholePage(page, 'new-case-baseline');

    await page.getByRole('button', { name: /Save case/ }).click();
    await page.waitForURL(/\/cases\/\d+$/);
    await page.getByText(code).first().waitFor();
    expect(problems).toEqual([]);
  });
});
