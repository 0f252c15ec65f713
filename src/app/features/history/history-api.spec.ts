import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { HistoryApi } from './history-api';

describe('HistoryApi', () => {
  let api: HistoryApi;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    api = TestBed.inject(HistoryApi);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('asks for one page of the whole history', async () => {
    const result = firstValueFrom(api.list({ page: 2, pageSize: 25 }));
    const request = http.expectOne((candidate) => candidate.url === '/api/history');
    expect(request.request.params.get('page')).toBe('2');
    expect(request.request.params.get('pageSize')).toBe('25');
    expect(request.request.params.has('caseId')).toBe(false);
    request.flush({ items: [], total: 0 });
    expect(await result).toEqual({ items: [], total: 0 });
  });

  it("narrows to one case's records", () => {
    void firstValueFrom(api.list({ page: 0, pageSize: 50, caseId: 12 }));
    const request = http.expectOne((candidate) => candidate.url === '/api/history');
    expect(request.request.params.get('caseId')).toBe('12');
    request.flush({ items: [], total: 0 });
  });
});
