import { Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { Router, Routes, provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { SessionUser } from '@tidemark/shared';
import { NAVIGATION, rolesFor } from '../shell/navigation';
import { roleGuard } from './role-guard';
import { personWithRole, provideStubAuthSession } from './testing/stub-auth-session';

@Component({ template: '' })
class BlankPage {}

/** Every shell page, guarded exactly as in app.routes.ts. */
const routes: Routes = [
  { path: 'sign-in', component: BlankPage },
  ...NAVIGATION.map((item) => ({
    path: item.path.slice(1),
    component: BlankPage,
    canActivate: [roleGuard(...rolesFor(item.path))],
  })),
];

async function landingUrl(user: SessionUser | null, url: string): Promise<string> {
  TestBed.configureTestingModule({ providers: [provideStubAuthSession(user), provideRouter(routes)] });
  const harness = await RouterTestingHarness.create();
  await harness.navigateByUrl(url);
  return TestBed.inject(Router).url;
}

describe('roleGuard', () => {
  it('lets an allowed role through', async () => {
    expect(await landingUrl(personWithRole('admin'), '/team')).toBe('/team');
  });

  it("sends a clinician who opens Team to the clinician's home", async () => {
    expect(await landingUrl(personWithRole('clinician'), '/team')).toBe('/today');
  });

  it("sends governance away from Cases to the governance home", async () => {
    expect(await landingUrl(personWithRole('governance'), '/cases')).toBe('/audits');
  });

  it("sends an administrator away from Today to the administrator's home", async () => {
    expect(await landingUrl(personWithRole('admin'), '/today')).toBe('/cases');
  });

  it('sends a signed-out visitor to sign in', async () => {
    expect(await landingUrl(null, '/reports')).toBe('/sign-in?returnUrl=%2Freports');
  });
});
