import { Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { SecondFactorState } from '@tidemark/shared';
import { enrolmentGuard } from './enrolment-guard';
import { personWithRole, provideStubAuthSession } from './testing/stub-auth-session';

@Component({ template: '' })
class BlankPage {}

async function landingUrl(secondFactor: SecondFactorState, url: string): Promise<string> {
  TestBed.configureTestingModule({
    providers: [
      provideStubAuthSession(personWithRole('admin'), secondFactor),
      provideRouter([
        {
          path: '',
          canActivateChild: [enrolmentGuard],
          children: [
            { path: 'cases', component: BlankPage },
            { path: 'account/security', component: BlankPage },
          ],
        },
      ]),
    ],
  });
  const harness = await RouterTestingHarness.create();
  await harness.navigateByUrl(url);
  return TestBed.inject(Router).url;
}

describe('enrolmentGuard', () => {
  it('sends someone who must set up one-time codes to Sign-in protection', async () => {
    expect(await landingUrl('enrolment-required', '/cases')).toBe('/account/security');
  });

  it('lets them stay on Sign-in protection', async () => {
    expect(await landingUrl('enrolment-required', '/account/security')).toBe('/account/security');
  });

  it.each<SecondFactorState>(['none', 'verified'])('lets a %s session through', async (state) => {
    expect(await landingUrl(state, '/cases')).toBe('/cases');
  });
});
