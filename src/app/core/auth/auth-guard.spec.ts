import { Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { SessionUser } from '@tidemark/shared';
import { authGuard } from './auth-guard';
import { personWithRole, provideStubAuthSession } from './testing/stub-auth-session';

@Component({ template: '' })
class BlankPage {}

async function landingUrl(user: SessionUser | null, url: string): Promise<string> {
  TestBed.configureTestingModule({
    providers: [
      provideStubAuthSession(user),
      provideRouter([
        { path: 'sign-in', component: BlankPage },
        { path: 'cases', component: BlankPage, canActivate: [authGuard] },
      ]),
    ],
  });
  const harness = await RouterTestingHarness.create();
  await harness.navigateByUrl(url);
  return TestBed.inject(Router).url;
}

describe('authGuard', () => {
  it('sends a signed-out visitor to sign in, keeping the page as returnUrl', async () => {
    expect(await landingUrl(null, '/cases?operator=2')).toBe('/sign-in?returnUrl=%2Fcases%3Foperator%3D2');
  });

  it('lets a signed-in person through', async () => {
    expect(await landingUrl(personWithRole('partner'), '/cases')).toBe('/cases');
  });
});
