import path from 'node:path';
import ExcelJS from 'exceljs';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { RESULTS_DIR, launchBrowser } from './support/browser';
import { startServer, type RunningServer } from './support/server';
import { choose } from './support/material-select';
import { watchProblems } from './support/page-problems';
import { signIn } from './support/sign-in';
import { screenshotWholePage } from './support/whole-page-screenshot';

/** The demo audit the seed creates, with a reported (frozen) first cycle (server/demo/seed-demo-audits.ts). */
const DEMO_AUDIT = 'Margin stability after aesthetic crown lengthening';
/** Patient codes as the demo practice writes them; a governance workbook must never carry one. */
const PATIENT_CODE = /HP-\d{4}/;

/** The machine running these may be busy (scrypt sign-in, lazy chunks); waits get a minute, not 30 s. */
const PATIENT_WAIT_MS = 60_000;

/** Opens Reports from the menu and sets the demo audit's reported cycle as the scope. */
async function openReportsOnFrozenCycle(page: Page): Promise<void> {
  await page.getByRole('navigation', { name: 'Main navigation' }).getByRole('link', { name: /Reports/ }).click();
  await page.getByRole('heading', { name: 'Reports', level: 1 }).waitFor();
  await choose(page, 'Audit', DEMO_AUDIT);
  await choose(page, 'Scope', /^Cycle 1 .*Reported, frozen$/);
  await page.getByText('Frozen when the cycle was reported').waitFor();
}

describe('governance pack journey in Chromium', () => {
  let server: RunningServer;
  let browser: Browser;
  let context: BrowserContext | undefined;

  beforeAll(async () => {
    server = await startServer();
    browser = await launchBrowser();
  });

  /** A fresh browser context with the patient default timeout. */
  async function newContext(options: Parameters<Browser['newContext']>[0] = {}): Promise<BrowserContext> {
    const created = await browser.newContext({ viewport: { width: 1280, height: 800 }, ...options });
    created.setDefaultTimeout(PATIENT_WAIT_MS);
    return created;
  }
  afterEach(async () => {
    await context?.close();
    context = undefined;
  });
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });

  it('the audit lead tells the committee after a confirmation, and finds the import page', async () => {
    context = await newContext();
    const page = await context.newPage();
    const problems = watchProblems(page);
    await signIn(page, server.baseUrl, 'lead@example.org');
    await openReportsOnFrozenCycle(page);

    await page.getByRole('button', { name: 'Tell the committee' }).click();
    const dialog = page.getByRole('dialog');
    await expect(dialog.innerText()).resolves.toMatch(/sign-in link.*no patient data/s);
    await dialog.getByRole('button', { name: 'Send the e-mail' }).click();
    await expect(page.getByText(/^Sent to \d+ committee members?\.$/).innerText()).resolves.toMatch(/Sent to [1-9]/);

    await page.getByRole('link', { name: 'Import past cases' }).click();
    await page.waitForURL(/\/cases\/import$/);
    await page.getByRole('heading', { name: 'Import past cases', level: 1 }).waitFor();
    await page.getByRole('cell', { name: 'patient_code' }).waitFor();
    await screenshotWholePage(page, 'import');
    expect(problems).toEqual([]);
  });

  it('a governance member builds the workbook for the reported cycle and downloads it', async () => {
    context = await newContext({ acceptDownloads: true });
    const page = await context.newPage();
    const problems = watchProblems(page);
    await signIn(page, server.baseUrl, 'governance@example.org');
    await openReportsOnFrozenCycle(page);
    // Telling the committee is the audit lead's; governance only builds the workbook.
    await expect(page.getByRole('button', { name: 'Tell the committee' }).count()).resolves.toBe(0);

    await page.getByRole('button', { name: 'Build governance workbook' }).click();
    const downloadLink = page.getByRole('link', { name: 'Download the workbook' });
    await downloadLink.waitFor();
    const shownName = (await page.locator('.file-name').innerText()).trim();
    await screenshotWholePage(page, 'reports');

    const [download] = await Promise.all([page.waitForEvent('download'), downloadLink.click()]);
    expect(download.suggestedFilename()).toBe(shownName);
    const saved = path.join(RESULTS_DIR, 'governance-workbook.xlsx');
    await download.saveAs(saved);

    const workbook = new ExcelJS.Workbook();
    await workbook.xlsx.readFile(saved);
    const names = workbook.worksheets.map((sheet) => sheet.name);
    expect(names.length).toBeGreaterThanOrEqual(5);
    expect(names).toEqual(expect.arrayContaining(['Front page', 'Criteria', 'Site data', 'Method notes', 'Charts']));
    const siteData = workbook.getWorksheet('Site data');
    expect(siteData?.rowCount ?? 0).toBeGreaterThan(1);
    const firstColumn = (siteData?.getColumn(1).values ?? []).map((value) => String(value ?? ''));
    expect(firstColumn.some((value) => PATIENT_CODE.test(value))).toBe(false);

    // On a tablet held upright the page folds into one column and never needs sideways scrolling.
    const tablet = await context.newPage();
    await tablet.setViewportSize({ width: 820, height: 1180 });
    await tablet.goto(`${server.baseUrl}/reports`);
    await tablet.getByRole('button', { name: 'Build governance workbook' }).waitFor();
    const overflow = await tablet.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await screenshotWholePage(tablet, 'reports-tablet');
    expect(problems).toEqual([]);
  });

  it('the administrator sees the committee notice in the Outbox and opens it', async () => {
    context = await newContext();
    const page = await context.newPage();
    const problems = watchProblems(page);
    await signIn(page, server.baseUrl, 'admin@example.org');
    await page.getByRole('navigation', { name: 'Main navigation' }).getByRole('link', { name: /Outbox/ }).click();
    const table = page.getByRole('table', { name: 'Outgoing e-mail, newest first' });
    await table.waitFor();
    const packRow = table.getByRole('row').filter({ hasText: 'Committee pack notice' }).first();
    await packRow.waitFor();
    await expect(packRow.innerText()).resolves.toMatch(/Sent|Waiting to retry|Waiting to send|Failed/);

    await packRow.getByRole('button', { name: /governance pack ready/ }).click();
    await expect(page.locator('tm-message-detail pre').innerText()).resolves.toMatch(/Sign in to download it: .*\/reports/);
    await screenshotWholePage(page, 'outbox');
    expect(problems).toEqual([]);
  });
});
