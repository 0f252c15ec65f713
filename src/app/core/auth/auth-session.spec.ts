import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { AuthSession } from './auth-session';
import { personWithRole } from './testing/stub-auth-session';

describe('AuthSession', () => {
  let session: AuthSession;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    session = TestBed.inject(AuthSession);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('restores the signed-in person from GET /api/auth/me', async () => {
    const restored = session.restore();
    http.expectOne({ method: 'GET', url: '/api/auth/me' }).flush({ user: personWithRole('partner') });
    await restored;
    expect(session.user()?.role).toBe('partner');
    expect(session.isSignedIn()).toBe(true);
  });

  it('treats a 401 from /api/auth/me as signed out', async () => {
    const restored = session.restore();
    http
      .expectOne('/api/auth/me')
      .flush({ error: { code: 'unauthenticated', message: 'Sign in first.' } }, { status: 401, statusText: 'Unauthorized' });
    await restored;
    expect(session.user()).toBeNull();
  });

  it('fetches a fresh anti-forgery token once and retries when sign-in meets a csrf rejection', async () => {
    const signedIn = firstValueFrom(session.signIn({ email: 'lead@example.org', password: 'pw' }));
    http
      .expectOne('/api/auth/login')
      .flush({ error: { code: 'csrf', message: 'Invalid token.' } }, { status: 403, statusText: 'Forbidden' });
    http.expectOne('/api/auth/me').flush(null, { status: 401, statusText: 'Unauthorized' });
    http.expectOne('/api/auth/login').flush({ user: personWithRole('audit_lead') });
    expect((await signedIn).role).toBe('audit_lead');
    expect(session.user()?.role).toBe('audit_lead');
  });

  it('keeps the app closed while a one-time code is due, and opens it once the code is accepted', async () => {
    const signedIn = firstValueFrom(session.signIn({ email: 'lead@example.org', password: 'pw' }));
    http.expectOne('/api/auth/login').flush({ user: personWithRole('audit_lead'), secondFactor: 'pending' });
    await signedIn;
    expect(session.user()?.role).toBe('audit_lead');
    expect(session.isSignedIn()).toBe(false);
    expect(session.isAwaitingCode()).toBe(true);

    const verified = firstValueFrom(session.verifySecondFactor({ method: 'one-time-code', code: '123456' }));
    const request = http.expectOne({ method: 'POST', url: '/api/auth/second-factor/verify' });
    expect(request.request.body).toEqual({ method: 'one-time-code', code: '123456' });
    request.flush({ user: personWithRole('audit_lead'), secondFactor: 'verified' });
    await verified;
    expect(session.isSignedIn()).toBe(true);
    expect(session.secondFactor()).toBe('verified');
  });

  it('restores a session that still owes its code as not signed in', async () => {
    const restored = session.restore();
    http.expectOne('/api/auth/me').flush({ user: personWithRole('admin'), secondFactor: 'pending' });
    await restored;
    expect(session.isSignedIn()).toBe(false);
    expect(session.isAwaitingCode()).toBe(true);
  });

  it('passes a wrong password on to the form without retrying', async () => {
    const signedIn = firstValueFrom(session.signIn({ email: 'lead@example.org', password: 'nope' }));
    http
      .expectOne('/api/auth/login')
      .flush({ error: { code: 'unauthenticated', message: 'No match.' } }, { status: 401, statusText: 'Unauthorized' });
    await expect(signedIn).rejects.toMatchObject({ status: 401 });
    expect(session.user()).toBeNull();
  });

  it('signs out on the server, then fetches a fresh token, then forgets the user', async () => {
    const restored = session.restore();
    http.expectOne('/api/auth/me').flush({ user: personWithRole('admin') });
    await restored;

    const signedOut = firstValueFrom(session.signOut());
    http.expectOne({ method: 'POST', url: '/api/auth/logout' }).flush(null, { status: 204, statusText: 'No Content' });
    expect(session.user()).not.toBeNull();
    http.expectOne('/api/auth/me').flush(null, { status: 401, statusText: 'Unauthorized' });
    await signedOut;
    expect(session.user()).toBeNull();
  });
});
