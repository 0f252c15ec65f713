import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { CaseCreateRequest, PatientView } from '@tidemark/shared';
import { firstValueFrom } from 'rxjs';
import { SHOWS_OWN_ERRORS } from '../../core/http/shows-own-errors';
import { CaseEntryApi } from './case-entry-api';

const patient: PatientView = {
  id: 3,
  code: 'TM-0007',
  birthYear: 1984,
  sex: 'female',
  smoking: 'never',
  cigarettesPerDay: null,
  diabetes: 'none',
  phenotype: 'thin',
  phenotypeMethod: 'probe-visibility',
  version: 1,
};

const body: CaseCreateRequest = {
  patientId: 3,
  operatorId: 4,
  surgeryDate: '2026-01-12',
  procedure: 'gingivectomy',
  indication: 'aesthetic',
  instrument: 'scalpel',
  hygienePhaseComplete: true,
  sites: [{ tooth: 11, location: 'mid-facial', referencePoint: 'incisal-edge', baselineRefGm: 8 }],
};

describe('CaseEntryApi', () => {
  let api: CaseEntryApi;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    api = TestBed.inject(CaseEntryApi);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('lists operators with GET /api/operators', async () => {
    const result = firstValueFrom(api.operators());
    const request = http.expectOne('/api/operators');
    expect(request.request.method).toBe('GET');
    request.flush([{ id: 4, displayName: 'Dr Ana Reyes' }]);
    expect(await result).toEqual([{ id: 4, displayName: 'Dr Ana Reyes' }]);
  });

  it('searches patients by a trimmed code', async () => {
    const result = firstValueFrom(api.findPatients(' tm-00 '));
    const request = http.expectOne((each) => each.url === '/api/patients');
    expect(request.request.params.get('code')).toBe('tm-00');
    request.flush([patient]);
    expect(await result).toEqual([patient]);
  });

  it('registers a case with POST /api/cases and shows its own errors', async () => {
    const result = firstValueFrom(api.createCase(body));
    const request = http.expectOne('/api/cases');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual(body);
    expect(request.request.context.get(SHOWS_OWN_ERRORS)).toBe(true);
    request.flush({ id: 91 }, { status: 201, statusText: 'Created' });
    expect((await result).id).toBe(91);
  });

  it('passes a taken patient code on to the caller', async () => {
    const result = firstValueFrom(api.createCase(body));
    http
      .expectOne('/api/cases')
      .flush({ error: { code: 'conflict', message: 'A patient with this code is already registered.' } }, { status: 409, statusText: 'Conflict' });
    await expect(result).rejects.toMatchObject({ status: 409 });
  });
});
