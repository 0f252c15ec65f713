import type { Role } from '@tidemark/shared';
import type { Locator, Page } from 'playwright-core';

/** Records a screen needs, found through the API as the signed-in role sees them. */
export interface DemoRecords {
  /** The demo audit with a reported and a re-audit cycle (server/demo/seed-demo-audits.ts). */
  readonly auditId: number;
  /** A case with photographs (and, where the demo has one, complications), or any case; null where the role reads no cases. */
  readonly caseId: number | null;
  /** A recall due now for this role's cases, or null. */
  readonly recall: { readonly caseId: number; readonly intervalKey: string } | null;
}

/** What a screen is opened with. */
export interface ScreenVisit {
  readonly page: Page;
  readonly baseUrl: string;
  readonly records: DemoRecords;
}

/** One screen (or one open dialog) to check, for one role. */
export interface Screen {
  readonly name: string;
  /** Navigates, waits until the screen is ready and leaves it as a person would see it. */
  open(visit: ScreenVisit): Promise<void>;
  /** Saved as a screenshot in both themes. */
  readonly isPictured?: boolean;
}

/** Reads JSON from the API with the page's session (GET needs no CSRF token). */
async function apiGet<T>(page: Page, path: string): Promise<T> {
  const answer = await page.evaluate(async (url) => {
    const response = await fetch(url, { headers: { Accept: 'application/json' } });
    return { status: response.status, body: await response.text() };
  }, path);
  if (answer.status !== 200) throw new Error(`GET ${path} answered ${answer.status}: ${answer.body.slice(0, 200)}`);
  return JSON.parse(answer.body) as T;
}

interface AuditRow {
  id: number;
  cycles: unknown[];
}
interface CaseRow {
  id: number;
  visitCount: number;
}
interface CaseDetailRow {
  photos: unknown[];
  complications: unknown[];
}
interface DueRow {
  caseId: number;
  intervalKey: string;
}

/** Finds the records the screens of `role` open. */
export async function findRecords(page: Page, role: Role): Promise<DemoRecords> {
  const readsAudits = role !== 'admin';
  const audits = readsAudits ? await apiGet<AuditRow[]>(page, '/api/audits') : [];
  const auditId = [...audits].sort((a, b) => b.cycles.length - a.cycles.length)[0]?.id ?? 1;
  let caseId: number | null = null;
  if (role !== 'governance') {
    const { items } = await apiGet<{ items: CaseRow[] }>(page, '/api/cases?pageSize=200&sort=surgeryDate&direction=asc');
    const visited = items.filter((row) => row.visitCount > 0);
    // All at once: the details of every seen case, in list order.
    const details = await Promise.all(visited.map((row) => apiGet<CaseDetailRow>(page, `/api/cases/${row.id}`)));
    const withPhotos = visited.filter((_, index) => details[index].photos.length > 0);
    const withBoth = visited.filter((_, index) => details[index].photos.length > 0 && details[index].complications.length > 0);
    caseId = withBoth[0]?.id ?? withPhotos[0]?.id ?? visited[0]?.id ?? items[0]?.id ?? null;
  }
  let recall: DemoRecords['recall'] = null;
  if (role === 'audit_lead' || role === 'clinician') {
    const due = await apiGet<{ inWindow: DueRow[]; overdue: DueRow[] }>(page, '/api/recalls/due');
    const first = due.inWindow[0] ?? due.overdue[0];
    recall = first ? { caseId: first.caseId, intervalKey: first.intervalKey } : null;
  }
  return { auditId, caseId, recall };
}

/**
 * Waits until nothing on the page says it is still loading, the web fonts are in, and any notice
 * has been handed to screen readers (Material keeps a snack bar's text aria-hidden for a moment
 * before moving it into its live region).
 */
export async function settle(page: Page): Promise<void> {
  await page.waitForFunction(
    () =>
      !document.querySelector('mat-progress-bar[mode="indeterminate"], [aria-busy="true"], .mat-mdc-snack-bar-label > [aria-hidden="true"]') &&
      document.fonts.status === 'loaded',
    null,
    { timeout: 20_000 },
  );
}

/** The text of an error notice (snack bar) on the page, if one is showing: a screen that opens with one is broken. */
export async function errorNotice(page: Page): Promise<string | null> {
  const notice = page.locator('.mat-mdc-snack-bar-container');
  return (await notice.count()) ? (await notice.first().innerText()).replace(/\s+/g, ' ').trim() : null;
}

async function visitPath(visit: ScreenVisit, path: string, ready: (page: Page) => Locator): Promise<void> {
  await visit.page.goto(visit.baseUrl + path);
  await ready(visit.page).first().waitFor({ timeout: 20_000 });
  await settle(visit.page);
}

const heading = (name: string | RegExp) => (page: Page) => page.getByRole('heading', { level: 1, name });

/** A page reached by its address, ready when its main heading shows. */
function route(name: string, path: string | ((records: DemoRecords) => string), ready: (page: Page) => Locator, isPictured = false): Screen {
  return {
    name,
    isPictured,
    open: (visit) => visitPath(visit, typeof path === 'string' ? path : path(visit.records), ready),
  };
}

/** A screen reached from another by a few steps. */
function after(base: Screen, name: string, steps: (page: Page) => Promise<void>, isPictured = false): Screen {
  return {
    name,
    isPictured,
    async open(visit) {
      await base.open(visit);
      await steps(visit.page);
      await settle(visit.page);
    },
  };
}

/** Clicks a button and waits for the dialog it opens to be in place. */
async function openDialog(page: Page, trigger: Locator): Promise<void> {
  await trigger.click();
  const dialog = page.getByRole('dialog');
  await dialog.waitFor();
  // The dialog's enter animation ends with it fully opaque; contrast is measured after that.
  await page.waitForFunction(() => {
    const surface = document.querySelector('.mat-mdc-dialog-container');
    return !!surface && getComputedStyle(surface).opacity === '1' && !surface.classList.contains('mat-mdc-dialog-container-animating');
  });
}

async function openTab(page: Page, name: string | RegExp): Promise<void> {
  await page.getByRole('tab', { name }).click();
  await page.getByRole('tabpanel').first().waitFor();
}

const casePath = (records: DemoRecords) => `/cases/${records.caseId ?? 1}`;
const recallPath = (records: DemoRecords) => (records.recall ? `/cases/${records.recall.caseId}/recall/${records.recall.intervalKey}` : '/today');
const auditPath = (area: string, extra = '') => (records: DemoRecords) => `/audits/${records.auditId}?area=${area}${extra}`;

// Screens shared by several roles.
const caseList = route('cases', '/cases', heading('Cases'), true);
const casesNoMatch = route('cases-no-match', '/cases?patientCode=ZZ-NO-SUCH-CODE', heading('Cases'));
const casePage = route('case', casePath, (page) => page.locator('#case-heading'), true);
const history = route('history', '/history', heading('Change history'));
const auditList = route('audits', '/audits', heading('Audits'), true);
const auditScope = route('audit-scope', auditPath('scope'), (page) => page.locator('#audit-heading'));
const auditCriteria = route('audit-criteria', auditPath('criteria'), (page) => page.getByRole('tabpanel'));
const auditResults = route('audit-results', auditPath('results'), (page) => page.locator('figure canvas'), true);
const auditResultsNumbers = after(
  auditResults,
  'audit-results-numbers',
  async (page) => {
    const toggles = page.getByRole('button', { name: 'Show the numbers' });
    for (let count = await toggles.count(); count > 0; count--) await toggles.first().click();
  },
  true,
);
const auditResultsCycle = route('audit-results-cycle-1-by-phenotype', auditPath('results', '&cycle=1&groupBy=phenotype'), (page) => page.locator('figure canvas'));
const auditCycles = route('audit-cycles', auditPath('cycles'), (page) => page.getByRole('heading', { name: 'Cycle comparison' }), true);
const reports = route('reports', '/reports', heading('Reports'), true);
const today = route('today', '/today', heading('Today'), true);
const recallEntry = route('recall-entry', recallPath, (page) => page.getByRole('heading', { name: 'Site readings' }), true);
const newCase = route('new-case', '/cases/new', heading('New case'), true);
const security = route('account-security', '/account/security', heading('Sign-in protection'));

/** The case page's areas and dialogs, for a role that writes cases. */
const caseAreas: Screen[] = [
  after(casePage, 'case-photographs', (page) => openTab(page, /^Photographs/)),
  after(casePage, 'case-photo-viewer', async (page) => {
    await openTab(page, /^Photographs/);
    await openDialog(page, page.locator('tm-photo-gallery button.tile').first());
  }),
  after(casePage, 'case-complications', (page) => openTab(page, /^Complications/)),
  after(casePage, 'case-complication-dialog', async (page) => {
    await openTab(page, /^Complications/);
    await openDialog(page, page.getByRole('button', { name: 'Add complication' }));
  }),
  after(casePage, 'case-change-log', (page) => openTab(page, /^Change log/)),
  // A case still in recall, which can move on (a concluded one cannot).
  after(route('case-in-recall', (records) => `/cases/${records.recall?.caseId ?? records.caseId ?? 1}`, (page) => page.locator('#case-heading')), 'case-status-dialog', (page) =>
    openDialog(page, page.getByRole('group', { name: /^Change the case.s status$/ }).getByRole('button').first()),
  ),
];

/** Opens a Material select from the keyboard (its floating label covers it for the mouse) and picks its first option. */
async function chooseFirst(page: Page, label: string): Promise<void> {
  await page.getByRole('combobox', { name: label }).focus();
  await page.keyboard.press('Enter');
  await page.getByRole('option').first().click();
  await page.getByRole('listbox').waitFor({ state: 'detached' });
}

const patientErrors = after(newCase, 'new-case-patient-errors', async (page) => {
  await page.getByRole('button', { name: 'Next: surgery plan' }).click();
  await page.locator('mat-error').first().waitFor();
});
const surgeryPlan = after(newCase, 'new-case-surgery-plan', async (page) => {
  await page.getByLabel('Patient code').fill('HP-A11Y');
  await page.getByLabel('Birth year').fill('1980');
  for (const label of ['Sex', 'Smoking', 'Diabetes', 'Gingival phenotype', 'Phenotype assessed by']) await chooseFirst(page, label);
  await page.getByRole('button', { name: 'Next: surgery plan' }).click();
  await page.getByLabel('Surgery date').waitFor();
});
const teethAndSites = after(
  surgeryPlan,
  'new-case-teeth',
  async (page) => {
    for (const label of ['Procedure', 'Indication', 'Instrument']) await chooseFirst(page, label);
    await page.getByRole('button', { name: 'Next: teeth & sites' }).click();
    await page.getByRole('button', { name: /^11, / }).click();
    await page.getByRole('heading', { name: /Sites measured/ }).waitFor();
  },
  true,
);
const baselineReadings = after(
  teethAndSites,
  'new-case-baseline',
  async (page) => {
    await page.getByRole('button', { name: 'Next: baseline readings' }).click();
    await page.getByRole('group', { name: /^11 · / }).first().waitFor();
  },
  true,
);

/** The New case stepper, step by step, as the clinician fills it in (nothing is saved). */
const newCaseSteps: Screen[] = [patientErrors, surgeryPlan, teethAndSites, baselineReadings];

/** Recall entry after Save with nothing entered (errors shown in place), and with a change large enough to ask for a confirmation. */
const recallStates: Screen[] = [
  after(recallEntry, 'recall-entry-errors', async (page) => {
    await page.getByRole('button', { name: /^Save recall$|^Save correction$/ }).click();
    await page.locator('mat-error').first().waitFor();
  }),
  after(recallEntry, 'recall-large-change-dialog', async (page) => {
    const readings = page.locator('input[data-field="refGm"]');
    for (let index = 0, count = await readings.count(); index < count; index++) await readings.nth(index).fill('19.5');
    await openDialog(page, page.getByRole('button', { name: /^Save recall$|^Save correction$/ }));
  }),
];

/** A file the import refuses (one row, nearly every column wrong), so the error report shows. */
const BROKEN_IMPORT = { name: 'broken.csv', mimeType: 'text/csv', buffer: Buffer.from('patient_code,birth_year\nnot a code!,17\n') };

const caseImport = route('case-import', '/cases/import', heading('Import past cases'), true);

/** Every screen each role may open (DESIGN.md §2 and §5; routes in src/app/app.routes.ts and the feature routes). */
export const SCREENS: Record<Role, readonly Screen[]> = {
  admin: [
    caseList,
    casePage,
    history,
    route('team', '/team', heading('Team'), true),
    after(route('team', '/team', heading('Team')), 'team-add-member-dialog', (page) => openDialog(page, page.getByRole('button', { name: 'Add team member' }))),
    after(route('team', '/team', heading('Team')), 'team-status-dialog', async (page) => {
      await page.getByRole('button', { name: /^Actions for / }).last().click();
      await page.getByRole('menuitem', { name: /Deactivate|Reactivate/ }).click();
      await page.getByRole('dialog').waitFor();
    }),
    route('outbox', '/outbox', heading('Outbox'), true),
    after(route('outbox', '/outbox', heading('Outbox')), 'outbox-message', async (page) => {
      await page.locator('button.subject').first().click();
      await page.locator('#message-subject').waitFor();
    }),
    route('settings', '/settings', heading('Settings')),
    security,
    after(security, 'account-security-enrolment', async (page) => {
      await page.getByRole('button', { name: 'Set up one-time codes' }).click();
      await page.locator('tm-enrolment-panel img, tm-enrolment-panel svg').first().waitFor();
    }),
  ],
  audit_lead: [
    today,
    caseList,
    casesNoMatch,
    casePage,
    ...caseAreas,
    newCase,
    recallEntry,
    ...recallStates,
    caseImport,
    after(caseImport, 'case-import-errors', async (page) => {
      await page.locator('#import-file').setInputFiles(BROKEN_IMPORT);
      await page.getByRole('button', { name: 'Check and import' }).click();
      await page.getByRole('link', { name: 'Download the error report' }).waitFor({ timeout: 30_000 });
    }),
    auditList,
    route('new-audit', '/audits/new', heading('New audit'), true),
    auditScope,
    auditCriteria,
    after(auditCriteria, 'standard-dialog', (page) => openDialog(page, page.getByRole('button', { name: 'Add standard' }))),
    auditResults,
    auditResultsNumbers,
    auditResultsCycle,
    auditCycles,
    after(auditCycles, 'cycle-dialog', (page) => openDialog(page, page.getByRole('button', { name: 'New cycle' }))),
    after(auditCycles, 'action-dialog', (page) => openDialog(page, page.getByRole('button', { name: 'Add action' }).first())),
    reports,
    after(reports, 'committee-notice-dialog', (page) => openDialog(page, page.getByRole('button', { name: 'Tell the committee' }))),
    history,
    security,
  ],
  clinician: [today, caseList, casePage, newCase, ...newCaseSteps, recallEntry, auditList, auditScope, auditCriteria, auditResults, auditCycles, history],
  partner: [caseList, casePage, auditList, auditScope, auditCriteria, auditResults, auditResultsNumbers, auditCycles, reports, history],
  governance: [auditList, auditScope, auditCriteria, auditResults, auditCycles, reports],
};
