import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter, withComponentInputBinding } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { SecondFactorState, SessionUser } from '@tidemark/shared';
import { routes } from './app.routes';
import { personWithRole, provideStubAuthSession } from './core/auth/testing/stub-auth-session';

async function open(user: SessionUser | null, url: string, secondFactor: SecondFactorState = 'none'): Promise<{ url: string; text: string }> {
  TestBed.configureTestingModule({
    providers: [
      provideStubAuthSession(user, secondFactor),
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

  it('opens Settings to the administrator and keeps every other role out', async () => {
    expect((await open(personWithRole('admin'), '/settings')).url).toBe('/settings');
    TestBed.resetTestingModule();
    expect((await open(personWithRole('audit_lead'), '/settings')).url).not.toBe('/settings');
  });

  it('opens Sign-in protection to every role', async () => {
    expect((await open(personWithRole('governance'), '/account/security')).url).toBe('/account/security');
  });

  it('sends someone who must set up one-time codes from the root to Sign-in protection', async () => {
    expect((await open(personWithRole('audit_lead'), '/', 'enrolment-required')).url).toBe('/account/security');
  });

  it('keeps someone who must set up one-time codes out of every other page', async () => {
    expect((await open(personWithRole('admin'), '/team', 'enrolment-required')).url).toBe('/account/security');
  });

  it('sends unknown addresses home', async () => {
    expect((await open(personWithRole('admin'), '/no-such-page')).url).toBe('/cases');
  });
});
