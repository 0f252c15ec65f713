import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatNavListHarness } from '@angular/material/list/testing';
import { Router, provideRouter } from '@angular/router';
import { ROLES, ROLE_LABELS, type Role } from '@tidemark/shared';
import { StubAuthSession, personWithRole, provideStubAuthSession } from '../auth/testing/stub-auth-session';
import { navigationFor } from './navigation';
import { Shell } from './shell';

describe('Shell', () => {
  async function renderFor(role: Role): Promise<{ fixture: ComponentFixture<Shell>; loader: HarnessLoader }> {
    TestBed.configureTestingModule({
      providers: [provideRouter([]), provideStubAuthSession(personWithRole(role))],
    });
    const fixture = TestBed.createComponent(Shell);
    await fixture.whenStable();
    return { fixture, loader: TestbedHarnessEnvironment.loader(fixture) };
  }

  async function menuLabels(loader: HarnessLoader): Promise<string[]> {
    const list = await loader.getHarness(MatNavListHarness.with({ ancestor: 'nav[aria-label="Main navigation"]' }));
    const items = await list.getItems();
    return Promise.all(items.map((item) => item.getTitle()));
  }

  it.each(ROLES)('shows %s only the links of its role', async (role) => {
    const { loader } = await renderFor(role);
    expect(await menuLabels(loader)).toEqual(navigationFor(role).map((item) => item.label));
  });

  it('never shows Team to a clinician', async () => {
    const { loader } = await renderFor('clinician');
    expect(await menuLabels(loader)).not.toContain('Team');
  });

  it("shows the person's name and role label", async () => {
    const { fixture } = await renderFor('audit_lead');
    const toolbar: HTMLElement | null = fixture.nativeElement.querySelector('mat-toolbar');
    expect(toolbar?.textContent).toContain('Sam audit_lead');
    expect(toolbar?.textContent).toContain(ROLE_LABELS.audit_lead);
    expect(toolbar?.textContent).toContain('Tidemark');
  });

  it('signs out and returns to the sign-in page', async () => {
    const { loader } = await renderFor('partner');
    const navigate = vi.spyOn(TestBed.inject(Router), 'navigateByUrl').mockResolvedValue(true);
    await (await loader.getHarness(MatButtonHarness.with({ text: /Sign out$/ }))).click();
    expect(TestBed.inject(StubAuthSession).user()).toBeNull();
    expect(navigate).toHaveBeenCalledWith('/sign-in');
  });
});
