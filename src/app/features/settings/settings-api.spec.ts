import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { SHOWS_OWN_ERRORS } from '../../core/http/shows-own-errors';
import { SettingsApi } from './settings-api';
import { SYSTEM_OVERVIEW } from './testing/system-overview-fixture';

describe('SettingsApi', () => {
  let api: SettingsApi;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    api = TestBed.inject(SettingsApi);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('reads the overview with GET /api/settings/system, leaving errors to the global notice', async () => {
    const result = firstValueFrom(api.systemOverview());
    const request = http.expectOne('/api/settings/system');
    expect(request.request.method).toBe('GET');
    expect(request.request.context.get(SHOWS_OWN_ERRORS)).toBe(false);
    request.flush(SYSTEM_OVERVIEW);
    expect(await result).toEqual(SYSTEM_OVERVIEW);
  });

  it('takes a backup with POST /api/settings/backups and no body, showing its own errors', async () => {
    const taken = { name: 'tidemark-20260302T101500Z.sqlite', bytes: 4_200_000, takenAt: '2026-03-02T10:15:00.000Z', durationMs: 120 };
    const result = firstValueFrom(api.takeBackup());
    const request = http.expectOne('/api/settings/backups');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toBeNull();
    expect(request.request.context.get(SHOWS_OWN_ERRORS)).toBe(true);
    request.flush(taken, { status: 201, statusText: 'Created' });
    expect(await result).toEqual(taken);
  });
});
