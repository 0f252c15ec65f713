import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { SHOWS_OWN_ERRORS } from '../../core/http/shows-own-errors';
import { AccountSecurityApi } from './account-security-api';

describe('AccountSecurityApi', () => {
  let api: AccountSecurityApi;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    api = TestBed.inject(AccountSecurityApi);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('reads the status with GET /api/auth/second-factor', async () => {
    const result = firstValueFrom(api.status());
    const request = http.expectOne('/api/auth/second-factor');
    expect(request.request.method).toBe('GET');
    const status = { isEnabled: false, enabledAt: null, recoveryCodesLeft: 0, isRequired: true, policy: 'required' as const };
    request.flush(status);
    expect(await result).toEqual(status);
  });

  it('starts enrolment with POST …/enrolment', () => {
    void firstValueFrom(api.startEnrolment());
    const request = http.expectOne('/api/auth/second-factor/enrolment');
    expect(request.request.method).toBe('POST');
    request.flush({});
  });

  it.each([
    ['confirmEnrolment', '/api/auth/second-factor/enrolment/confirm'],
    ['regenerateRecoveryCodes', '/api/auth/second-factor/recovery-codes'],
    ['disable', '/api/auth/second-factor/disable'],
  ] as const)('%s posts the code to %s and shows its own errors', (method, url) => {
    const calls = {
      confirmEnrolment: () => api.confirmEnrolment({ code: '123456' }).subscribe(),
      regenerateRecoveryCodes: () => api.regenerateRecoveryCodes({ code: '123456' }).subscribe(),
      disable: () => api.disable({ code: '123456' }).subscribe(),
    };
    calls[method]();
    const request = http.expectOne(url);
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({ code: '123456' });
    expect(request.request.context.get(SHOWS_OWN_ERRORS)).toBe(true);
    request.flush({});
  });
});
