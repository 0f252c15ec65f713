import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { HttpEventType, provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatPaginatorHarness } from '@angular/material/paginator/testing';
import { MatProgressBarHarness } from '@angular/material/progress-bar/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import { provideRouter } from '@angular/router';
import { IMPORT_COLUMNS } from '@tidemark/shared';
import { JOB_POLL_INTERVAL_MS } from '../../../shared/job-polling/poll-until-finished';
import { nextRequest } from '../../../shared/job-polling/testing/next-request';
import type { ImportRowError } from '../case-import-api';
import { ImportPage, describeCounts } from './import-page';

const NONE = { patients: 0, cases: 0, sites: 0, visits: 0 };
const ERRORS: ImportRowError[] = Array.from({ length: 12 }, (_, index) => ({
  row: 2 + Math.floor(index / 2),
  column: index % 2 ? 'tooth' : 'baseline_ref_gm',
  message: index % 2 ? 'Use an FDI two-digit tooth number.' : 'Use 0.5 mm steps.',
}));

describe('ImportPage', () => {
  let fixture: ComponentFixture<ImportPage>;
  let loader: HarnessLoader;
  let http: HttpTestingController;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([]), { provide: JOB_POLL_INTERVAL_MS, useValue: 1 }],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ImportPage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  const element = (): HTMLElement => fixture.nativeElement;

  /** Simulates picking a file (jsdom cannot fill a file input's FileList itself). */
  async function pick(file: File): Promise<void> {
    const input = element().querySelector<HTMLInputElement>('input[type="file"]');
    if (!input) throw new Error('No file input.');
    Object.defineProperty(input, 'files', { configurable: true, value: { length: 1, 0: file, item: () => file } });
    input.dispatchEvent(new Event('change'));
    await fixture.whenStable();
  }

  async function upload(): Promise<void> {
    await pick(new File(['patient_code,birth_year\n'], 'past-cases.csv', { type: 'text/csv' }));
    await (await loader.getHarness(MatButtonHarness.with({ text: /Check and import/ }))).click();
  }

  it('states the all-or-nothing rule, offers both templates and lists every column', async () => {
    expect(element().textContent).toContain('If any row is wrong, nothing is stored');
    const links = [...element().querySelectorAll<HTMLAnchorElement>('a[download]')].map((link) => link.getAttribute('href'));
    expect(links).toEqual(['/api/imports/template.xlsx', '/api/imports/template.csv']);
    const guide = await loader.getHarness(MatTableHarness.with({ selector: '.guide' }));
    const cells = await guide.getCellTextByColumnName();
    expect(cells['column']?.text).toEqual([...IMPORT_COLUMNS]);
    expect(cells['need']?.text[0]).toBe('check_circleMust be there');
    expect(cells['need']?.text[IMPORT_COLUMNS.indexOf('pain')]).toBe('remove_circle_outlineMay be left out');
  });

  it('shows the upload, then the job, on determinate bars', async () => {
    await upload();
    const request = http.expectOne('/api/imports');
    request.event({ type: HttpEventType.UploadProgress, loaded: 40, total: 100 });
    await fixture.whenStable();
    const bar = await loader.getHarness(MatProgressBarHarness);
    expect(await bar.getMode()).toBe('determinate');
    expect(await bar.getValue()).toBe(40);
    expect(element().textContent).toContain('Sending the file');

    request.flush({ jobId: 'imp-4' }, { status: 202, statusText: 'Accepted' });
    (await nextRequest(http, '/api/imports/imp-4')).flush({ state: 'importing', progress: 0.7, counts: NONE, errors: [] });
    await fixture.whenStable();
    expect(await (await loader.getHarness(MatProgressBarHarness)).getValue()).toBe(70);
    expect(element().textContent).toContain('Storing the cases');

    (await nextRequest(http, '/api/imports/imp-4')).flush({ state: 'done', progress: 1, counts: { patients: 3, cases: 4, sites: 9, visits: 21 }, errors: [] });
    await fixture.whenStable();
    expect(element().querySelector('[role="status"]')?.textContent).toContain('3 patients, 4 cases, 9 sites and 21 recall visits were stored.');
    expect(element().querySelector('a[href="/cases"]')).not.toBeNull();
  });

  it('lists the row errors of a rejected file, a page at a time, with the error report', async () => {
    await upload();
    http.expectOne('/api/imports').flush({ jobId: 'imp-5' }, { status: 202, statusText: 'Accepted' });
    (await nextRequest(http, '/api/imports/imp-5')).flush({ state: 'rejected', progress: 1, counts: NONE, errors: ERRORS });
    await fixture.whenStable();

    expect(element().querySelector('[role="status"]')?.textContent).toContain('Nothing was stored');
    expect(element().textContent).toContain('6 rows need correcting (12 problems)');
    const table = await loader.getHarness(MatTableHarness.with({ selector: '.problems' }));
    const rows = await table.getCellTextByColumnName();
    expect(rows['row']?.text).toHaveLength(10);
    expect(rows['row']?.text[0]).toBe('2');
    expect(rows['column']?.text[1]).toBe('tooth');
    expect(rows['message']?.text[1]).toBe('Use an FDI two-digit tooth number.');
    const paginator = await loader.getHarness(MatPaginatorHarness);
    await paginator.goToNextPage();
    expect((await table.getCellTextByColumnName())['row']?.text).toEqual(['7', '7']);

    const report = element().querySelector<HTMLAnchorElement>('a[href="/api/imports/imp-5/errors.csv"]');
    expect(report?.textContent).toContain('Download the error report');
  });

  it("explains a refused upload in the server's words", async () => {
    await upload();
    http
      .expectOne('/api/imports')
      .flush({ error: { code: 'validation', message: 'The header row does not match the template.' } }, { status: 400, statusText: 'Bad Request' });
    await fixture.whenStable();
    expect(element().querySelector('[role="alert"]')?.textContent).toContain('The header row does not match the template.');
  });

  it('refuses a file over 10 MB before sending it', async () => {
    const big = new File(['x'], 'huge.xlsx');
    Object.defineProperty(big, 'size', { value: 11 * 1024 * 1024 });
    await pick(big);
    expect(element().querySelector('[role="alert"]')?.textContent).toContain('files up to 10 MB are accepted');
    expect(await (await loader.getHarness(MatButtonHarness.with({ text: /Check and import/ }))).isDisabled()).toBe(true);
  });

  it('writes the counts the way the browser’s language writes numbers', () => {
    const counts = { patients: 1, cases: 12_345, sites: 2, visits: 1 };
    // Expected digits from Intl.NumberFormat itself, the reference for each locale's grouping.
    for (const locale of ['en-GB', 'de-DE', 'fr-FR']) {
      const grouped = new Intl.NumberFormat(locale).format(12_345);
      expect(describeCounts(counts, locale)).toBe(`1 patient, ${grouped} cases, 2 sites and 1 recall visit were stored.`);
    }
    expect(new Intl.NumberFormat('de-DE').format(12_345)).toBe('12.345');
  });
});
