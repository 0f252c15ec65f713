import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter, withComponentInputBinding } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { SessionUser } from '@tidemark/shared';
import { routes } from './app.routes';
import { personWithRole, provideStubAuthSession } from './core/auth/testing/stub-auth-session';

async function open(user: SessionUser | null, url: string): Promise<{ url: string; text: string }> {
  TestBed.configureTestingModule({
    providers: [
      provideStubAuthSession(user),
      provideRouter(routes, withComponentInputBinding()),
      provideHttpClient(),
      provideHttpClientTesting(),
    ],
  });
  const harness = await RouterTestingHarness.create();
  await harness.navigateByUrl(url);
  return { url: TestBed.inject(Router).url, text: harness.routeNativeElement?.textContent ?? '' };
}

describe('app routes', () => {
  it('sends a signed-out visitor to sign in with the page they asked for', async () => {
    expect((await open(null, '/cases')).url).toBe('/sign-in?returnUrl=%2Fcases');
  });

  it("opens the role's home page at the root", async () => {
    expect((await open(personWithRole('governance'), '/')).url).toBe('/audits');
  });

  it("keeps a clinician out of Team", async () => {
    expect((await open(personWithRole('clinician'), '/team')).url).toBe('/today');
  });

  it('shows an honest placeholder with the release that brings the page', async () => {
    const page = await open(personWithRole('admin'), '/settings');
    expect(page.url).toBe('/settings');
    expect(page.text).toContain('Arrives with a later release.');
  });

  it('sends unknown addresses home', async () => {
    expect((await open(personWithRole('admin'), '/no-such-page')).url).toBe('/cases');
  });
});
