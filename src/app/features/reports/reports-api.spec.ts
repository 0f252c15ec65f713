import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { SHOWS_OWN_ERRORS } from '../../core/http/shows-own-errors';
import { ReportsApi, exportFileUrl, isExportFinished } from './reports-api';

describe('ReportsApi', () => {
  let api: ReportsApi;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    api = TestBed.inject(ReportsApi);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('lists audits with GET /api/audits, failures left to the global notice', async () => {
    const result = firstValueFrom(api.audits());
    const request = http.expectOne('/api/audits');
    expect(request.request.method).toBe('GET');
    expect(request.request.context.get(SHOWS_OWN_ERRORS)).toBe(false);
    request.flush([]);
    expect(await result).toEqual([]);
  });

  it.each([
    [4, { cycleId: 4 }],
    [null, { cycleId: null }],
  ])('starts an export for cycle %s with POST /api/audits/:id/exports', async (cycleId, body) => {
    const result = firstValueFrom(api.startExport(12, cycleId));
    const request = http.expectOne('/api/audits/12/exports');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual(body);
    expect(request.request.context.get(SHOWS_OWN_ERRORS)).toBe(true);
    request.flush({ jobId: 'job-7' }, { status: 202, statusText: 'Accepted' });
    expect(await result).toEqual({ jobId: 'job-7' });
  });

  it('reads the job with GET /api/exports/:jobId and names the file address', async () => {
    const result = firstValueFrom(api.exportStatus('a/b'));
    const request = http.expectOne('/api/exports/a%2Fb');
    expect(request.request.method).toBe('GET');
    expect(request.request.context.get(SHOWS_OWN_ERRORS)).toBe(true);
    request.flush({ state: 'running', progress: 0.5, rows: 10 });
    expect(isExportFinished(await result)).toBe(false);
    expect(exportFileUrl('job-7')).toBe('/api/exports/job-7/file');
    expect(exportFileUrl(31)).toBe('/api/exports/31/file');
  });

  it('counts done and failed jobs as finished', () => {
    expect(isExportFinished({ state: 'done', progress: 1, rows: 3 })).toBe(true);
    expect(isExportFinished({ state: 'failed', progress: 0.2, rows: 0, error: 'No.' })).toBe(true);
  });

  it('tells the committee with POST /api/audits/:id/send-pack and its cycle', async () => {
    const result = firstValueFrom(api.sendPack(12, 5));
    const request = http.expectOne('/api/audits/12/send-pack');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({ cycleId: 5 });
    expect(request.request.context.get(SHOWS_OWN_ERRORS)).toBe(true);
    request.flush({ queued: 3 }, { status: 202, statusText: 'Accepted' });
    expect(await result).toEqual({ queued: 3 });
  });
});
