import { HttpClient, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { errorNoticeInterceptor } from './error-notice-interceptor';
import { ErrorNotice } from './error-notice';
import { showsOwnErrors } from './shows-own-errors';

describe('errorNoticeInterceptor', () => {
  let http: HttpClient;
  let backend: HttpTestingController;
  const show = vi.fn<(message: string) => void>();

  beforeEach(() => {
    show.mockReset();
    TestBed.configureTestingModule({
      providers: [
        { provide: ErrorNotice, useValue: { show } },
        provideHttpClient(withInterceptors([errorNoticeInterceptor])),
        provideHttpClientTesting(),
      ],
    });
    http = TestBed.inject(HttpClient);
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => backend.verify());

  it("reports a conflict once, in the server's words", async () => {
    const call = firstValueFrom(http.patch('/api/users/1', { active: false }));
    backend
      .expectOne('/api/users/1')
      .flush(
        { error: { code: 'conflict', message: 'At least one administrator must stay active.' } },
        { status: 409, statusText: 'Conflict' },
      );
    await expect(call).rejects.toMatchObject({ status: 409 });
    expect(show).toHaveBeenCalledTimes(1);
    expect(show).toHaveBeenCalledWith('At least one administrator must stay active.');
  });

  it('reports an unreachable server in our own words', async () => {
    const call = firstValueFrom(http.get('/api/users'));
    backend.expectOne('/api/users').error(new ProgressEvent('error'), { status: 0, statusText: '' });
    await expect(call).rejects.toMatchObject({ status: 0 });
    expect(show).toHaveBeenCalledWith("Tidemark can't reach the server. Check the connection and try again.");
  });

  it('stays quiet when the caller shows its own errors', async () => {
    const call = firstValueFrom(http.post('/api/users', {}, { context: showsOwnErrors() }));
    backend.expectOne('/api/users').flush(null, { status: 500, statusText: 'Server Error' });
    await expect(call).rejects.toMatchObject({ status: 500 });
    expect(show).not.toHaveBeenCalled();
  });

  it('stays quiet about "not signed in" from /api/auth/*', async () => {
    const call = firstValueFrom(http.get('/api/auth/me'));
    backend.expectOne('/api/auth/me').flush(null, { status: 401, statusText: 'Unauthorized' });
    await expect(call).rejects.toMatchObject({ status: 401 });
    expect(show).not.toHaveBeenCalled();
  });
});
