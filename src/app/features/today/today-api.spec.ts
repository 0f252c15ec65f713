import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { RecallDueList } from '@tidemark/shared';
import { firstValueFrom } from 'rxjs';
import { TodayApi } from './today-api';

const EMPTY: RecallDueList = { asOf: '2026-03-10', inWindow: [], overdue: [], upcoming: [] };

describe('TodayApi', () => {
  let api: TodayApi;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    api = TestBed.inject(TodayApi);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it("asks for the server's today when no date is given", async () => {
    const result = firstValueFrom(api.due());
    const request = http.expectOne((candidate) => candidate.url === '/api/recalls/due');
    expect(request.request.method).toBe('GET');
    expect(request.request.params.keys()).toEqual([]);
    request.flush(EMPTY);
    expect(await result).toEqual(EMPTY);
  });

  it('passes a chosen day as asOf', () => {
    void firstValueFrom(api.due('2026-03-10'));
    const request = http.expectOne((candidate) => candidate.url === '/api/recalls/due');
    expect(request.request.params.get('asOf')).toBe('2026-03-10');
    request.flush(EMPTY);
  });
});
