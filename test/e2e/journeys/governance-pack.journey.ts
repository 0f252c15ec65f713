import { readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import ExcelJS from 'exceljs';
import { RESULTS_DIR } from '../support/browser';
import { screenshotWholePage } from '../support/whole-page-screenshot';
import { DEMO_ACCOUNTS, signIn, submitSignIn } from '../support/sign-in';
import type { Page } from 'playwright-core';
import { choose } from '../support/material-select';
import { watchProblems } from '../support/page-problems';
import { DEMO_AUDIT, newJourneyContext, pictureOnFailure, type JourneyWorld } from './support/journey-kit';

/** Patient codes as the demo practice writes them; a governance workbook must never carry one. */
const PATIENT_CODE = /HP-\d{4}/;

/**
 * Journey 4: the audit lead tells the committee the pack is ready (DESIGN.md §2: sending the
 * report e-mail is the audit lead's alone); the administrator sees the message in the Outbox; a
 * governance member follows its link, signs in, and downloads the workbook it points to.
 */
export async function governancePackJourney(world: JourneyWorld): Promise<void> {
  const { baseUrl } = world.server;
  const lead = await newJourneyContext(world);
  const admin = await newJourneyContext(world);
  const governance = await newJourneyContext(world, { acceptDownloads: true });
  // The page of whoever acts now, for a picture if the journey fails.
  let acting: Page | null = null;
  try {
    // Step 1: the audit lead chooses the demo audit's reported cycle on Reports and tells the committee.
    const leadPage = await lead.newPage();
    acting = leadPage;
    const leadProblems = watchProblems(leadPage);
    await signIn(leadPage, baseUrl, DEMO_ACCOUNTS.audit_lead);
    await leadPage.getByRole('navigation', { name: 'Main navigation' }).getByRole('link', { name: /Reports/ }).click();
    await leadPage.getByRole('heading', { name: 'Reports', level: 1 }).waitFor();
    await choose(leadPage, 'Audit', DEMO_AUDIT);
    await choose(leadPage, 'Scope', /^Cycle 1 .*Reported, frozen$/);
    await leadPage.getByRole('button', { name: 'Tell the committee' }).click();
    const confirm = leadPage.getByRole('dialog');
    await expect(confirm.innerText()).resolves.toMatch(/no patient data/);
    await confirm.getByRole('button', { name: 'Send the e-mail' }).click();
    await leadPage.getByText(/^Sent to [1-9]\d* committee members?\.$/).waitFor();
    await screenshotWholePage(leadPage, 'journey-4-lead-told-committee');
    expect(leadProblems).toEqual([]);

    // Step 2: the administrator finds "governance pack ready" in the Outbox (the demo's local SMTP stand-in caught it).
    const adminPage = await admin.newPage();
    acting = adminPage;
    const adminProblems = watchProblems(adminPage);
    await signIn(adminPage, baseUrl, DEMO_ACCOUNTS.admin);
    await adminPage.getByRole('navigation', { name: 'Main navigation' }).getByRole('link', { name: /Outbox/ }).click();
    const outbox = adminPage.getByRole('table', { name: 'Outgoing e-mail, newest first' });
    const packRow = outbox.getByRole('row').filter({ hasText: 'Committee pack notice' }).filter({ hasText: DEMO_ACCOUNTS.governance }).first();
    await packRow.waitFor();
    await packRow.getByRole('button', { name: /governance pack ready/ }).click();
    const body = adminPage.getByText(/Sign in to download it:/);
    await body.waitFor();
    await screenshotWholePage(adminPage, 'journey-4-outbox');
    const link = /Sign in to download it: (\S+)/.exec(await body.innerText())?.[1] ?? '';
    const linked = new URL(link);
    // The link names this server (its port was picked at start-up) and the pack's audit and cycle.
    expect(linked.origin).toBe(new URL(baseUrl).origin);
    expect(linked.pathname).toBe('/reports');
    expect(linked.searchParams.get('audit')).toMatch(/^\d+$/);
    expect(linked.searchParams.get('cycle')).toMatch(/^\d+$/);
    expect(adminProblems).toEqual([]);

    // Step 3: the governance member follows the link, is asked to sign in, and lands on that pack.
    const page = await governance.newPage();
    acting = page;
    const problems = watchProblems(page);
    await page.goto(link);
    await page.waitForURL(/\/sign-in\?returnUrl=/);
    await submitSignIn(page, DEMO_ACCOUNTS.governance);
    await page.waitForURL((url) => url.pathname === '/reports' && url.search === linked.search);
    await expect(page.getByRole('combobox', { name: 'Audit' }).innerText()).resolves.toBe(DEMO_AUDIT);
    await expect(page.getByRole('combobox', { name: 'Scope' }).innerText()).resolves.toMatch(/^Cycle 1 .*frozen$/);
    await page.getByText('Frozen when the cycle was reported').waitFor();
    // Telling the committee is the audit lead's alone.
    await expect(page.getByRole('button', { name: 'Tell the committee' }).count()).resolves.toBe(0);

    // Step 4: build the workbook (a job with a progress bar) and download it.
    await page.getByRole('button', { name: 'Build governance workbook' }).click();
    const download = page.getByRole('link', { name: 'Download the workbook' });
    await download.waitFor();
    await screenshotWholePage(page, 'journey-4-governance-reports');
    const [file] = await Promise.all([page.waitForEvent('download'), download.click()]);
    expect(file.suggestedFilename()).toMatch(/^tidemark-governance-audit-\d+-cycle-1-\d{4}-\d{2}-\d{2}\.xlsx$/);
    const saved = path.join(RESULTS_DIR, 'journey-4-governance-workbook.xlsx');
    await file.saveAs(saved);

    // Step 5: it is a real workbook: a zip ("PK", ISO/IEC 29500 packages are ZIP files), not a stub, that opens.
    expect(readFileSync(saved).subarray(0, 2).toString('latin1')).toBe('PK');
    expect(statSync(saved).size).toBeGreaterThan(10 * 1024);
    const workbook = new ExcelJS.Workbook();
    await workbook.xlsx.readFile(saved);
    expect(workbook.worksheets.map((sheet) => sheet.name)).toEqual(expect.arrayContaining(['Front page', 'Criteria', 'Site data']));
    const siteData = workbook.getWorksheet('Site data');
    expect((siteData?.getColumn(1).values ?? []).some((value) => PATIENT_CODE.test(String(value ?? '')))).toBe(false);
    expect(problems).toEqual([]);
  } catch (error) {
    if (acting) await pictureOnFailure(acting, 'journey-4', error);
    throw error;
  } finally {
    await Promise.all([lead.close(), admin.close(), governance.close()]);
  }
}
