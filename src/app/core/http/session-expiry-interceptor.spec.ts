import { HttpClient, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { StubAuthSession, personWithRole, provideStubAuthSession } from '../auth/testing/stub-auth-session';
import { sessionExpiryInterceptor } from './session-expiry-interceptor';

describe('sessionExpiryInterceptor', () => {
  let http: HttpClient;
  let backend: HttpTestingController;
  let router: Router;
  let session: StubAuthSession;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideRouter([]),
        provideStubAuthSession(personWithRole('audit_lead')),
        provideHttpClient(withInterceptors([sessionExpiryInterceptor])),
        provideHttpClientTesting(),
      ],
    });
    http = TestBed.inject(HttpClient);
    backend = TestBed.inject(HttpTestingController);
    router = TestBed.inject(Router);
    session = TestBed.inject(StubAuthSession);
  });

  afterEach(() => backend.verify());

  it('forgets the user and goes to sign in when an API call answers 401', async () => {
    const navigate = vi.spyOn(router, 'navigate').mockResolvedValue(true);
    const call = firstValueFrom(http.get('/api/users'));
    backend.expectOne('/api/users').flush({ error: { code: 'unauthenticated', message: 'Sign in.' } }, { status: 401, statusText: 'Unauthorized' });

    await expect(call).rejects.toMatchObject({ status: 401 });
    expect(session.user()).toBeNull();
    expect(navigate).toHaveBeenCalledWith(['/sign-in'], { queryParams: { returnUrl: '/' } });
  });

  it('leaves a 401 from /api/auth/* to the caller', async () => {
    const navigate = vi.spyOn(router, 'navigate').mockResolvedValue(true);
    const call = firstValueFrom(http.post('/api/auth/login', {}));
    backend.expectOne('/api/auth/login').flush({ error: { code: 'unauthenticated', message: 'No match.' } }, { status: 401, statusText: 'Unauthorized' });

    await expect(call).rejects.toMatchObject({ status: 401 });
    expect(session.user()).not.toBeNull();
    expect(navigate).not.toHaveBeenCalled();
  });

  it('does nothing for other errors', async () => {
    const navigate = vi.spyOn(router, 'navigate').mockResolvedValue(true);
    const call = firstValueFrom(http.get('/api/users'));
    backend.expectOne('/api/users').flush(null, { status: 403, statusText: 'Forbidden' });

    await expect(call).rejects.toMatchObject({ status: 403 });
    expect(session.user()).not.toBeNull();
    expect(navigate).not.toHaveBeenCalled();
  });
});
