import { spawnSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import type { Role } from '@tidemark/shared';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { axeViolations, blocking, describeFindings, type AxeFinding } from './accessibility/axe-scan';
import { layoutReport } from './accessibility/layout-report';
import { SCREENS, errorNotice, findRecords, settle, type DemoRecords, type Screen } from './accessibility/screens';
import { RESULTS_DIR, launchBrowser, screenshotPath } from './support/browser';
import { startServer, type RunningServer } from './support/server';
import { screenshotWholePage } from './support/whole-page-screenshot';

/** The theme is chosen per device under this key (src/app/core/theme/color-scheme.ts). */
const SCHEME_KEY = 'tidemark.color-scheme';
const THEMES = ['light', 'dark'] as const;
type Theme = (typeof THEMES)[number];

const ACCOUNTS: Record<Role, string> = {
  admin: 'admin@example.org',
  audit_lead: 'lead@example.org',
  clinician: 'clinician@example.org',
  partner: 'partner@example.org',
  governance: 'governance@example.org',
};
const ROLES = Object.keys(ACCOUNTS) as Role[];

/** The caution every results view carries (DESIGN.md §7), as src/app/shared/clinical-caution/clinical-caution.ts writes it. */
const CLINICAL_CAUTION = 'For clinical audit and quality improvement. Not a diagnostic tool; treatment decisions rest with the treating clinician.';

type StorageState = Awaited<ReturnType<BrowserContext['storageState']>>;

interface ContextOptions {
  readonly theme?: Theme;
  readonly viewport?: { width: number; height: number };
  /** The browser's language (Tidemark formats dates by it). */
  readonly locale?: string;
}

async function signIn(page: Page, baseUrl: string, email: string): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail', { exact: true }).fill(email);
  await page.getByRole('textbox', { name: 'Password' }).fill('tidemark-demo');
  await page.getByRole('button', { name: 'Sign in' }).click();
  // The toolbar, not the menu: on a tablet-sized screen the menu starts folded away.
  await page.getByRole('button', { name: 'Sign out' }).waitFor();
}

function screenOf(role: Role, name: string): Screen {
  const screen = SCREENS[role].find((entry) => entry.name === name);
  if (!screen) throw new Error(`No screen "${name}" for ${role}.`);
  return screen;
}

function firstLine(error: unknown): string {
  return error instanceof Error ? error.message.split('\n')[0] : String(error);
}

describe('accessibility, layout and print in Chromium', () => {
  let server: RunningServer;
  let browser: Browser;
  const sessions = new Map<Role, StorageState>();
  const records = new Map<Role, DemoRecords>();
  /** Every finding of every scan, serious or not, with timings, written to test-results/ for reading. */
  const report: { where: string; openMs: number; scanMs: number; findings: AxeFinding[] }[] = [];

  beforeAll(async () => {
    server = await startServer();
    browser = await launchBrowser();
  });
  afterAll(async () => {
    writeFileSync(`${RESULTS_DIR}/accessibility-report.json`, JSON.stringify(report, null, 2));
    await browser?.close();
    await server?.stop();
  });

  /** A context for one role: its session (signed in once, then reused), the theme chosen on the device, the browser's language. */
  async function openAs(role: Role | null, options: ContextOptions = {}): Promise<{ context: BrowserContext; page: Page; records: DemoRecords }> {
    const { theme = 'light', viewport = { width: 1280, height: 800 }, locale = 'en-GB' } = options;
    const session = role ? sessions.get(role) : undefined;
    // bypassCSP: the app's CSP forbids inline scripts, and axe-core is injected as one.
    const context = await browser.newContext({ viewport, locale, bypassCSP: true, reducedMotion: 'reduce', storageState: session });
    await context.addInitScript(([key, value]) => localStorage.setItem(key, value), [SCHEME_KEY, theme] as const);
    const page = await context.newPage();
    if (role && !session) {
      await signIn(page, server.baseUrl, ACCOUNTS[role]);
      sessions.set(role, await context.storageState());
    }
    let found = role ? records.get(role) : undefined;
    if (role && !found) {
      if (page.url() === 'about:blank') await page.goto(server.baseUrl);
      found = await findRecords(page, role);
      records.set(role, found);
    }
    return { context, page, records: found ?? { auditId: 1, caseId: null, recall: null } };
  }

  /** Scans the screen as it stands; returns the blocking findings as lines. */
  async function scan(page: Page, where: string, picture: string | null, openMs: number): Promise<string[]> {
    const started = Date.now();
    const findings = await axeViolations(page);
    report.push({ where, openMs, scanMs: Date.now() - started, findings });
    if (picture) await page.screenshot({ path: screenshotPath(picture) });
    return describeFindings(where, blocking(findings));
  }

  for (const theme of THEMES) {
    it(`finds no serious or critical WCAG 2.1 AA violation on any screen or dialog, ${theme} theme`, async () => {
      const problems: string[] = [];

      const signedOut = await openAs(null, { theme });
      let started = Date.now();
      await signedOut.page.goto(`${server.baseUrl}/sign-in`);
      await signedOut.page.getByRole('button', { name: 'Sign in' }).waitFor();
      await settle(signedOut.page);
      problems.push(...(await scan(signedOut.page, `${theme} signed-out sign-in`, `a11y-${theme}-sign-in`, Date.now() - started)));
      // The refusal is shown in place; an unknown address keeps the demo accounts clear of the failed-attempt limit.
      started = Date.now();
      await signedOut.page.getByLabel('E-mail', { exact: true }).fill('nobody@example.org');
      await signedOut.page.getByRole('textbox', { name: 'Password' }).fill('not-the-password');
      await signedOut.page.getByRole('button', { name: 'Sign in' }).click();
      await signedOut.page.getByRole('alert').first().waitFor();
      problems.push(...(await scan(signedOut.page, `${theme} signed-out sign-in-refused`, null, Date.now() - started)));
      await signedOut.context.close();

      for (const role of ROLES) {
        const { context, page, records: found } = await openAs(role, { theme });
        for (const screen of SCREENS[role]) {
          const where = `${theme} ${role} ${screen.name}`;
          started = Date.now();
          try {
            await screen.open({ page, baseUrl: server.baseUrl, records: found });
          } catch (error) {
            problems.push(`${where}: could not be opened — ${firstLine(error)}`);
            continue;
          }
          const notice = await errorNotice(page);
          if (notice) problems.push(`${where}: opens with an error notice — ${notice}`);
          problems.push(...(await scan(page, where, screen.isPictured ? `a11y-${theme}-${role}-${screen.name}` : null, Date.now() - started)));
        }
        await context.close();
      }

      expect(problems).toEqual([]);
      // About 70 screens in one theme: well under a minute on a quiet machine, several on a busy one.
    }, 300_000);
  }

  it('fits Today and recall entry on a 1024×768 tablet, with every reading explained', async () => {
    const { context, page, records: found } = await openAs('clinician', { viewport: { width: 1024, height: 768 } });
    const visit = { page, baseUrl: server.baseUrl, records: found };
    const overflow: string[] = [];
    for (const name of ['today', 'recall-entry']) {
      await screenOf('clinician', name).open(visit);
      const layout = await layoutReport(page);
      if (layout.pageScrollWidth > layout.viewportWidth || layout.paneOverflow > 0) {
        overflow.push(`${name}: page ${layout.pageScrollWidth} px, pane overflow ${layout.paneOverflow} px in ${layout.viewportWidth} px`);
      }
      await screenshotWholePage(page, `a11y-tablet-${name}`);
    }
    expect(overflow).toEqual([]);

    // Each reading's convention (DESIGN.md §3) is the field's accessible description, shown on focus.
    const readings = page.locator('input[data-field="refGm"], input[data-field="probingDepth"], input[data-field="ktWidth"]');
    expect(await readings.count()).toBeGreaterThan(0);
    const descriptions = await readings.evaluateAll((inputs) =>
      inputs.map((input) =>
        (input.getAttribute('aria-describedby') ?? '')
          .split(' ')
          .map((id) => document.getElementById(id)?.textContent ?? '')
          .join(' '),
      ),
    );
    for (const description of descriptions) expect(description).toMatch(/nearest 0\.5 mm/);
    const refGm = page.locator('input[data-field="refGm"]').first();
    await refGm.focus();
    await page.keyboard.press('Shift+Tab');
    await page.keyboard.press('Tab');
    // Material's tooltip carries no ARIA role of its own: the input's description (checked above) is what is read out.
    const tooltip = page.locator('.mat-mdc-tooltip');
    await tooltip.waitFor();
    expect(await tooltip.innerText()).toMatch(/Rebound = post-op − recall/);
    await context.close();
  });

  it('frames every table so it scrolls sideways instead of widening the page, at 1024 and 800 px', async () => {
    const pages: [Role, string][] = [
      ['audit_lead', 'cases'],
      ['audit_lead', 'case'],
      ['audit_lead', 'case-change-log'],
      ['audit_lead', 'history'],
      ['audit_lead', 'audit-criteria'],
      ['audit_lead', 'audit-results-numbers'],
      ['audit_lead', 'audit-cycles'],
      ['audit_lead', 'case-import-errors'],
      ['admin', 'team'],
      ['admin', 'outbox'],
    ];
    const problems: string[] = [];
    for (const width of [1024, 800]) {
      for (const role of ['audit_lead', 'admin'] as const) {
        const { context, page, records: found } = await openAs(role, { viewport: { width, height: 768 } });
        for (const [owner, name] of pages.filter(([owner]) => owner === role)) {
          const where = `${width}px ${owner} ${name}`;
          try {
            await screenOf(owner, name).open({ page, baseUrl: server.baseUrl, records: found });
          } catch (error) {
            problems.push(`${where}: could not be opened — ${firstLine(error)}`);
            continue;
          }
          const layout = await layoutReport(page);
          if (layout.tableCount === 0) problems.push(`${where}: no table to check`);
          if (layout.unframedTables.length) problems.push(`${where}: tables without a sideways-scrolling frame: ${layout.unframedTables.join('; ')}`);
          if (layout.pageScrollWidth > layout.viewportWidth || layout.paneOverflow > 0) {
            problems.push(`${where}: the page is ${layout.pageScrollWidth} px wide (pane overflow ${layout.paneOverflow} px) in ${layout.viewportWidth} px`);
          }
          if (width === 800 && name === 'audit-results-numbers') await screenshotWholePage(page, 'a11y-800-audit-results-numbers');
        }
        await context.close();
      }
    }
    expect(problems).toEqual([]);
  });

  it('prints the results page with each chart whole, its caption and the clinical caution, and no app controls', async () => {
    const { context, page, records: found } = await openAs('partner');
    await screenOf('partner', 'audit-results').open({ page, baseUrl: server.baseUrl, records: found });
    await page.emulateMedia({ media: 'print' });
    const printed = await page.evaluate(() => {
      const isShown = (element: Element): boolean => element.getClientRects().length > 0 && getComputedStyle(element).visibility !== 'hidden';
      const figures = Array.from(document.querySelectorAll('tm-results-charts figure'));
      return {
        // The chosen filter chips stay on paper as the record of the view printed; every other control goes.
        shownControls: Array.from(document.querySelectorAll('mat-toolbar, mat-sidenav, .mat-mdc-tab-header, button:not(.mat-mdc-chip-action), mat-paginator')).filter(isShown).length,
        figures: figures.length,
        wholeFigures: figures.filter((figure) => getComputedStyle(figure).breakInside === 'avoid').length,
        // Every chart's text alternative: its numbers as a table behind a toggle (hidden on paper, there on screen).
        tabledFigures: figures.filter((figure) => figure.querySelector('button.numbers-toggle[aria-controls]')).length,
        captionedFigures: figures.filter((figure) => {
          const caption = figure.querySelector('figcaption');
          return !!caption && isShown(caption) && /clinical audit/.test(caption.textContent ?? '');
        }).length,
        text: document.body.innerText,
      };
    });
    expect(printed.shownControls).toBe(0);
    expect(printed.figures).toBeGreaterThanOrEqual(7);
    expect(printed.wholeFigures).toBe(printed.figures);
    expect(printed.tabledFigures).toBe(printed.figures);
    expect(printed.captionedFigures).toBe(printed.figures);
    expect(printed.text.replace(/\s+/g, ' ')).toContain(CLINICAL_CAUTION);
    await screenshotWholePage(page, 'a11y-print-results');

    const pdfPath = `${RESULTS_DIR}/results-print.pdf`;
    const pdf = await page.pdf({ path: pdfPath, format: 'A4', printBackground: true, margin: { top: '12mm', bottom: '12mm', left: '12mm', right: '12mm' } });
    // Each page object of the PDF is "/Type /Page" (ISO 32000-1, §7.7.3.3); the pages tree node is "/Type /Pages".
    expect(pdf.toString('latin1').match(/\/Type\s*\/Page\b/g)?.length ?? 0).toBeGreaterThanOrEqual(3);
    // A picture of the first pages when poppler-utils is installed; the check above does not depend on it.
    spawnSync('pdftoppm', ['-png', '-r', '60', '-f', '1', '-l', '3', pdfPath, `${RESULTS_DIR}/results-print-page`]);
    await context.close();
  });

  it('writes dates the way the browser’s language does', async () => {
    const shown: Record<string, string> = {};
    for (const [language, locale] of [
      ['en-GB', 'en-GB'],
      ['en-US', 'en-US'],
      ['de-DE', 'de'],
    ] as const) {
      const { context, page } = await openAs('clinician', { locale: language });
      await page.goto(`${server.baseUrl}/today`);
      const asOf = page.locator('tm-today-page .lead time');
      await asOf.waitFor();
      const text = (await asOf.innerText()).trim();
      // The same date as the browser's own Intl writes it for the locale Tidemark should have chosen (ECMA-402).
      const expected = await asOf.evaluate((element, tag) => {
        const [year, month, day] = (element.getAttribute('datetime') ?? '').split('-').map(Number);
        return new Intl.DateTimeFormat(tag, { weekday: 'long', day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' }).format(Date.UTC(year, month - 1, day));
      }, locale);
      expect(text).toBe(expected);
      shown[language] = text;
      await context.close();
    }
    expect(new Set(Object.values(shown)).size).toBe(3);
  });
});
