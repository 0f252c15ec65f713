import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, TestRequest, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { CalibrationResult } from '@tidemark/shared';
import { firstValueFrom } from 'rxjs';
import { ResultsApi } from './results-api';

describe('ResultsApi', () => {
  let api: ResultsApi;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    api = TestBed.inject(ResultsApi);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  function only(url: string): TestRequest {
    return http.expectOne((candidate) => candidate.url === url);
  }

  function paramsOf(request: TestRequest): Record<string, string | null> {
    const params = request.request.params;
    return Object.fromEntries(params.keys().map((key) => [key, params.get(key)]));
  }

  it('asks for live, ungrouped results without any query parameter', () => {
    void firstValueFrom(api.results(7, { cycleId: null, groupBy: null }));
    const request = only('/api/audits/7/results');
    expect(request.request.method).toBe('GET');
    expect(paramsOf(request)).toEqual({});
    request.flush({});
  });

  it('sends the cycle and the grouping of results', () => {
    void firstValueFrom(api.results(7, { cycleId: 3, groupBy: 'phenotype' }));
    const request = only('/api/audits/7/results');
    expect(paramsOf(request)).toEqual({ cycleId: '3', groupBy: 'phenotype' });
    request.flush({});
  });

  it('sends measure and interval to the funnel, leaving an unset interval to the server', () => {
    void firstValueFrom(api.funnel(7, { cycleId: null, measure: 'relapse', intervalKey: '6m' }));
    expect(paramsOf(only('/api/audits/7/funnel'))).toEqual({ measure: 'relapse', intervalKey: '6m' });
    void firstValueFrom(api.funnel(7, { cycleId: 2, measure: 'complication', intervalKey: null }));
    const second = only('/api/audits/7/funnel');
    expect(paramsOf(second)).toEqual({ cycleId: '2', measure: 'complication' });
    http.match(() => true).forEach((request) => request.flush({}));
  });

  it('scopes trend, survival and calibration to a cycle', () => {
    void firstValueFrom(api.trend(7, { cycleId: 2, intervalKey: '12m' }));
    void firstValueFrom(api.survival(7, { cycleId: 2 }));
    void firstValueFrom(api.calibration(7, { cycleId: null }));
    const trend = only('/api/audits/7/trend');
    const survival = only('/api/audits/7/survival');
    const calibration = only('/api/audits/7/calibration');
    expect(paramsOf(trend)).toEqual({ cycleId: '2', intervalKey: '12m' });
    expect(paramsOf(survival)).toEqual({ cycleId: '2' });
    expect(paramsOf(calibration)).toEqual({});
    trend.flush({});
    survival.flush({});
    calibration.flush({});
  });

  it('narrows every view to a phenotype and an operator, except the funnel, which takes the phenotype only', () => {
    const narrowed = { cycleId: null, phenotype: 'thin', operatorId: 9 } as const;
    void firstValueFrom(api.results(7, { ...narrowed, groupBy: null }));
    void firstValueFrom(api.trend(7, { ...narrowed, intervalKey: '6m' }));
    void firstValueFrom(api.survival(7, narrowed));
    void firstValueFrom(api.calibration(7, narrowed));
    void firstValueFrom(api.funnel(7, { cycleId: null, phenotype: 'thin', measure: 'complication', intervalKey: null }));
    expect(paramsOf(only('/api/audits/7/results'))).toEqual({ phenotype: 'thin', operatorId: '9' });
    expect(paramsOf(only('/api/audits/7/trend'))).toEqual({ phenotype: 'thin', operatorId: '9', intervalKey: '6m' });
    expect(paramsOf(only('/api/audits/7/survival'))).toEqual({ phenotype: 'thin', operatorId: '9' });
    expect(paramsOf(only('/api/audits/7/calibration'))).toEqual({ phenotype: 'thin', operatorId: '9' });
    expect(paramsOf(only('/api/audits/7/funnel'))).toEqual({ phenotype: 'thin', measure: 'complication' });
    http.match(() => true).forEach((request) => request.flush({}));
  });

  it('hands back the server’s answer as it came', async () => {
    const answer: CalibrationResult = {
      pairs: 0,
      withinOneMm: { count: 0, n: 0, p: null, lower: null, upper: null },
      kappa: null,
      icc: null,
      blandAltman: null,
      meetsCalibrationTarget: null,
    };
    const result = firstValueFrom(api.calibration(4, { cycleId: null }));
    only('/api/audits/4/calibration').flush(answer);
    expect(await result).toEqual(answer);
  });
});
