import { HttpEventType, provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom, toArray } from 'rxjs';
import { SHOWS_OWN_ERRORS } from '../../core/http/shows-own-errors';
import { CaseImportApi, importErrorReportUrl, importTemplateUrl, isImportFinished } from './case-import-api';

describe('CaseImportApi', () => {
  let api: CaseImportApi;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    api = TestBed.inject(CaseImportApi);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('uploads the file as multipart field "file" with progress events', async () => {
    const file = new File(['patient_code\n'], 'past-cases.csv', { type: 'text/csv' });
    const events = firstValueFrom(api.upload(file).pipe(toArray()));
    const request = http.expectOne('/api/imports');
    expect(request.request.method).toBe('POST');
    expect(request.request.reportProgress).toBe(true);
    expect(request.request.context.get(SHOWS_OWN_ERRORS)).toBe(true);
    const body = request.request.body;
    expect(body instanceof FormData && body.get('file')).toBeInstanceOf(File);
    expect(body instanceof FormData && [...body.keys()]).toEqual(['file']);
    request.event({ type: HttpEventType.UploadProgress, loaded: 5, total: 10 });
    request.flush({ jobId: 'imp-1' }, { status: 202, statusText: 'Accepted' });
    const types = (await events).map((event) => event.type);
    expect(types).toContain(HttpEventType.UploadProgress);
    expect(types).toContain(HttpEventType.Response);
  });

  it('reads a job with GET /api/imports/:jobId', async () => {
    const result = firstValueFrom(api.status('imp-1'));
    const request = http.expectOne('/api/imports/imp-1');
    expect(request.request.method).toBe('GET');
    request.flush({ state: 'validating', progress: 0.1, counts: { patients: 0, cases: 0, sites: 0, visits: 0 }, errors: [] });
    expect(isImportFinished(await result)).toBe(false);
  });

  it('knows the template and error report addresses', () => {
    expect(importTemplateUrl('xlsx')).toBe('/api/imports/template.xlsx');
    expect(importTemplateUrl('csv')).toBe('/api/imports/template.csv');
    expect(importErrorReportUrl('imp-1')).toBe('/api/imports/imp-1/errors.csv');
  });

  it.each(['done', 'failed', 'rejected'] as const)('counts %s as finished', (state) => {
    expect(isImportFinished({ state, progress: 1, counts: { patients: 0, cases: 0, sites: 0, visits: 0 }, errors: [] })).toBe(true);
  });
});
