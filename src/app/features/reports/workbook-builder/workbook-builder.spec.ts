import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatProgressBarHarness } from '@angular/material/progress-bar/testing';
import { JOB_POLL_INTERVAL_MS } from '../../../shared/job-polling/poll-until-finished';
import { nextRequest, pause } from '../../../shared/job-polling/testing/next-request';
import { ReportScope } from '../report-scope';
import { auditFixture } from '../testing/report-fixtures';
import { WorkbookBuilder } from './workbook-builder';

const AUDIT = auditFixture();
const FROZEN_CYCLE: ReportScope = { audit: AUDIT, cycle: AUDIT.cycles[0] ?? null };

describe('WorkbookBuilder', () => {
  let fixture: ComponentFixture<WorkbookBuilder>;
  let loader: HarnessLoader;
  let http: HttpTestingController;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), { provide: JOB_POLL_INTERVAL_MS, useValue: 1 }],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(WorkbookBuilder);
    fixture.componentRef.setInput('scope', FROZEN_CYCLE);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  const element = (): HTMLElement => fixture.nativeElement;
  const buildButton = () => loader.getHarness(MatButtonHarness.with({ text: /Build governance workbook/ }));

  async function startBuild(): Promise<void> {
    await (await buildButton()).click();
    const start = http.expectOne('/api/audits/12/exports');
    expect(start.request.body).toEqual({ cycleId: 71 });
    start.flush({ jobId: 'job-9' }, { status: 202, statusText: 'Accepted' });
  }

  it('takes the file name from the server when the status carries one', async () => {
    await startBuild();
    (await nextRequest(http, '/api/exports/job-9')).flush({ state: 'done', progress: 1, rows: 4, fileName: 'named-by-server.xlsx' });
    await fixture.whenStable();
    expect(element().querySelector('a[download]')?.getAttribute('download')).toBe('named-by-server.xlsx');
  });

  it('follows the job with a determinate bar, stops polling when done and offers the file', async () => {
    await startBuild();
    (await nextRequest(http, '/api/exports/job-9')).flush({ state: 'running', progress: 0.25, rows: 0 });
    await fixture.whenStable();
    const bar = await loader.getHarness(MatProgressBarHarness);
    expect(await bar.getMode()).toBe('determinate');
    expect(await bar.getValue()).toBe(25);
    expect(await (await buildButton()).isDisabled()).toBe(true);

    (await nextRequest(http, '/api/exports/job-9')).flush({ state: 'running', progress: 0.6, rows: 1200 });
    await fixture.whenStable();
    expect(await bar.getValue()).toBe(60);
    expect(element().textContent).toContain('1,200 rows written');

    (await nextRequest(http, '/api/exports/job-9')).flush({ state: 'done', progress: 1, rows: 2400 });
    await fixture.whenStable();
    await pause(30);
    http.expectNone('/api/exports/job-9');

    expect(await loader.getAllHarnesses(MatProgressBarHarness)).toHaveLength(0);
    const link = element().querySelector<HTMLAnchorElement>('a[download]');
    expect(link?.getAttribute('href')).toBe('/api/exports/job-9/file');
    const today = new Date().toISOString().slice(0, 10);
    expect(link?.getAttribute('download')).toBe(`tidemark-governance-audit-12-cycle-1-${today}.xlsx`);
    expect(element().querySelector('[role="status"]')?.textContent).toContain(`tidemark-governance-audit-12-cycle-1-${today}.xlsx`);
    expect(element().querySelector('[role="status"]')?.textContent).toContain('2,400 site rows');
  });

  it("tells a failed job once, in the server's words", async () => {
    await startBuild();
    (await nextRequest(http, '/api/exports/job-9')).flush({ state: 'failed', progress: 0.4, rows: 0, error: 'The audit has no sites in this cycle.' });
    await fixture.whenStable();
    await pause(30);
    http.expectNone('/api/exports/job-9');
    const alerts = [...element().querySelectorAll('[role="alert"]')].map((alert) => alert.textContent?.trim());
    expect(alerts).toEqual(['errorThe audit has no sites in this cycle.']);
    expect(element().querySelector('a[download]')).toBeNull();
    expect(await (await buildButton()).isDisabled()).toBe(false);
  });

  it("shows a refused start in the server's words", async () => {
    await (await buildButton()).click();
    http
      .expectOne('/api/audits/12/exports')
      .flush({ error: { code: 'forbidden', message: 'Clinicians cannot export the governance workbook.' } }, { status: 403, statusText: 'Forbidden' });
    await fixture.whenStable();
    expect(element().querySelector('[role="alert"]')?.textContent).toContain('Clinicians cannot export the governance workbook.');
  });

  it('starts afresh when the scope changes, dropping a running job', async () => {
    await startBuild();
    (await nextRequest(http, '/api/exports/job-9')).flush({ state: 'running', progress: 0.3, rows: 0 });
    await fixture.whenStable();
    const inFlight = await nextRequest(http, '/api/exports/job-9');
    fixture.componentRef.setInput('scope', { audit: AUDIT, cycle: null });
    await fixture.whenStable();
    expect(inFlight.cancelled).toBe(true);
    await pause(30);
    http.expectNone('/api/exports/job-9');
    expect(await loader.getAllHarnesses(MatProgressBarHarness)).toHaveLength(0);
    expect(element().textContent).toContain('live results');
  });
});
