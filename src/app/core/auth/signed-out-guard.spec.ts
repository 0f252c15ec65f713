import { Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { SecondFactorState, SessionUser } from '@tidemark/shared';
import { signedOutGuard } from './signed-out-guard';
import { personWithRole, provideStubAuthSession } from './testing/stub-auth-session';

@Component({ template: '' })
class BlankPage {}

async function landingUrl(user: SessionUser | null, secondFactor: SecondFactorState = 'none'): Promise<string> {
  TestBed.configureTestingModule({
    providers: [
      provideStubAuthSession(user, secondFactor),
      provideRouter([
        { path: 'sign-in', component: BlankPage, canActivate: [signedOutGuard] },
        { path: 'audits', component: BlankPage },
      ]),
    ],
  });
  const harness = await RouterTestingHarness.create();
  await harness.navigateByUrl('/sign-in');
  return TestBed.inject(Router).url;
}

describe('signedOutGuard', () => {
  it('shows the sign-in page to a signed-out visitor', async () => {
    expect(await landingUrl(null)).toBe('/sign-in');
  });

  it('shows the sign-in page (its code step) to someone whose one-time code is still due', async () => {
    expect(await landingUrl(personWithRole('admin'), 'pending')).toBe('/sign-in');
  });

  it('sends someone already signed in to their home page', async () => {
    expect(await landingUrl(personWithRole('governance'))).toBe('/audits');
  });
});
