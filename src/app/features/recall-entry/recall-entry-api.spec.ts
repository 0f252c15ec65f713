import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { VisitCreateRequest } from '@tidemark/shared';
import { firstValueFrom } from 'rxjs';
import { SHOWS_OWN_ERRORS } from '../../core/http/shows-own-errors';
import { RecallEntryApi } from './recall-entry-api';

const visit: VisitCreateRequest = {
  intervalKey: '6w',
  visitDate: '2026-03-02',
  pain: 1,
  satisfaction: 9,
  notes: '',
  measurements: [{ siteId: 11, refGm: 9.5, probingDepth: 2, bleedingOnProbing: false, ktWidth: 3, papillaScore: null }],
  confirmLargeChange: false,
};

describe('RecallEntryApi', () => {
  let api: RecallEntryApi;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    api = TestBed.inject(RecallEntryApi);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('loads the case with GET /api/cases/:id and lets the global notice report failures', async () => {
    const result = firstValueFrom(api.getCase(42));
    const request = http.expectOne('/api/cases/42');
    expect(request.request.method).toBe('GET');
    expect(request.request.context.get(SHOWS_OWN_ERRORS)).toBe(false);
    request.flush({ id: 42 });
    expect((await result).id).toBe(42);
  });

  it('records a recall with POST /api/cases/:id/visits and shows its own errors', async () => {
    const result = firstValueFrom(api.recordVisit(42, visit));
    const request = http.expectOne('/api/cases/42/visits');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual(visit);
    expect(request.request.context.get(SHOWS_OWN_ERRORS)).toBe(true);
    request.flush({ id: 42 }, { status: 201, statusText: 'Created' });
    expect((await result).id).toBe(42);
  });

  it('corrects a recall with PATCH /api/visits/:id and passes a conflict on', async () => {
    const correction = { version: 2, reason: 'Probe misread', measurements: visit.measurements };
    const result = firstValueFrom(api.correctVisit(7, correction));
    const request = http.expectOne('/api/visits/7');
    expect(request.request.method).toBe('PATCH');
    expect(request.request.body).toEqual(correction);
    expect(request.request.context.get(SHOWS_OWN_ERRORS)).toBe(true);
    request.flush({ error: { code: 'conflict', message: 'Changed meanwhile.', details: { currentVersion: 3 } } }, { status: 409, statusText: 'Conflict' });
    await expect(result).rejects.toMatchObject({ status: 409 });
  });
});
