import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { UserView } from '@tidemark/shared';
import { firstValueFrom } from 'rxjs';
import { SHOWS_OWN_ERRORS } from '../../core/http/shows-own-errors';
import { TeamApi } from './team-api';

const member: UserView = {
  id: 7,
  email: 'rowan@example.org',
  displayName: 'Rowan Hale',
  role: 'clinician',
  active: true,
  createdAt: '2026-01-05T09:00:00.000Z',
  lastSignInAt: null,
  secondFactorEnabled: true,
};

describe('TeamApi', () => {
  let api: TeamApi;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    api = TestBed.inject(TeamApi);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('lists the team with GET /api/users', async () => {
    const result = firstValueFrom(api.list());
    const request = http.expectOne('/api/users');
    expect(request.request.method).toBe('GET');
    request.flush([member]);
    expect(await result).toEqual([member]);
  });

  it('creates a member with POST /api/users and handles its own errors', async () => {
    const body = { email: 'rowan@example.org', displayName: 'Rowan Hale', role: 'clinician' as const, password: 'twelve chars ok' };
    const result = firstValueFrom(api.create(body));
    const request = http.expectOne('/api/users');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual(body);
    expect(request.request.context.get(SHOWS_OWN_ERRORS)).toBe(true);
    request.flush(member, { status: 201, statusText: 'Created' });
    expect(await result).toEqual(member);
  });

  it('sends only the changed fields with PATCH /api/users/:id', async () => {
    const result = firstValueFrom(api.update(7, { active: false }));
    const request = http.expectOne('/api/users/7');
    expect(request.request.method).toBe('PATCH');
    expect(request.request.body).toEqual({ active: false });
    expect(request.request.context.get(SHOWS_OWN_ERRORS)).toBe(false);
    request.flush({ ...member, active: false });
    expect((await result).active).toBe(false);
  });

  it('renames and sets a password with PATCH /api/users/:id, each sending only its field and showing its own errors', async () => {
    const renamed = firstValueFrom(api.rename(7, 'Rowan Hale-Park'));
    const rename = http.expectOne('/api/users/7');
    expect(rename.request.method).toBe('PATCH');
    expect(rename.request.body).toEqual({ displayName: 'Rowan Hale-Park' });
    expect(rename.request.context.get(SHOWS_OWN_ERRORS)).toBe(true);
    rename.flush({ ...member, displayName: 'Rowan Hale-Park' });
    expect((await renamed).displayName).toBe('Rowan Hale-Park');

    const reset = firstValueFrom(api.setPassword(7, 'a new long passphrase'));
    const password = http.expectOne('/api/users/7');
    expect(password.request.method).toBe('PATCH');
    expect(password.request.body).toEqual({ password: 'a new long passphrase' });
    expect(password.request.context.get(SHOWS_OWN_ERRORS)).toBe(true);
    password.flush(member);
    expect((await reset).id).toBe(7);
  });

  it("resets a member's sign-in protection with DELETE /api/users/:id/second-factor", async () => {
    const result = firstValueFrom(api.resetSecondFactor(7));
    const request = http.expectOne('/api/users/7/second-factor');
    expect(request.request.method).toBe('DELETE');
    request.flush(null, { status: 204, statusText: 'No Content' });
    await expect(result).resolves.toBeNull();
  });

  it('passes a conflict on to the caller', async () => {
    const result = firstValueFrom(api.update(1, { role: 'partner' }));
    http
      .expectOne('/api/users/1')
      .flush(
        { error: { code: 'conflict', message: 'At least one administrator must stay active.' } },
        { status: 409, statusText: 'Conflict' },
      );
    await expect(result).rejects.toMatchObject({ status: 409 });
  });
});
