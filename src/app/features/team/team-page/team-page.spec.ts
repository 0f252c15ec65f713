import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatMenuHarness } from '@angular/material/menu/testing';
import { MatSortHarness } from '@angular/material/sort/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import type { UserView } from '@tidemark/shared';
import { personWithRole, provideStubAuthSession } from '../../../core/auth/testing/stub-auth-session';
import { TeamPage } from './team-page';

const TEAM: UserView[] = [
  {
    id: 1,
    email: 'ines@example.org',
    displayName: 'Ines Okafor',
    role: 'admin',
    active: true,
    createdAt: '2026-01-02T08:00:00.000Z',
    lastSignInAt: '2026-03-04T09:15:00.000Z',
    secondFactorEnabled: true,
  },
  {
    id: 2,
    email: 'bram@example.org',
    displayName: 'Bram Lind',
    role: 'clinician',
    active: false,
    createdAt: '2026-01-03T08:00:00.000Z',
    lastSignInAt: null,
    secondFactorEnabled: false,
  },
  {
    id: 3,
    email: 'aiko@example.org',
    displayName: 'Aiko Sato',
    role: 'audit_lead',
    active: true,
    createdAt: '2026-01-04T08:00:00.000Z',
    lastSignInAt: '2026-03-01T10:00:00.000Z',
    secondFactorEnabled: true,
  },
];

describe('TeamPage', () => {
  let fixture: ComponentFixture<TeamPage>;
  let loader: HarnessLoader;
  let documentLoader: HarnessLoader;
  let http: HttpTestingController;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), provideStubAuthSession({ ...personWithRole('admin'), id: 1 })],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(TeamPage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    documentLoader = TestbedHarnessEnvironment.documentRootLoader(fixture);
    http.expectOne('/api/users').flush(TEAM);
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  async function column(name: string): Promise<string[]> {
    const table = await loader.getHarness(MatTableHarness);
    return table.getCellTextByColumnName().then((columns) => columns[name]?.text ?? []);
  }

  it('lists members sorted by name, with status as icon and word', async () => {
    expect(await column('name')).toEqual(['Aiko Sato', 'Bram Lind', 'Ines Okafor (you)']);
    expect(await column('role')).toEqual(['Audit lead', 'Clinician', 'Administrator']);
    // Each status cell holds an icon ligature followed by the word.
    const statuses = await column('status');
    expect(statuses).toEqual(['check_circleActive', 'do_not_disturb_onInactive', 'check_circleActive']);
    expect(await column('lastSignIn')).toContain('Never');
  });

  it('sorts by last sign-in when that header is clicked', async () => {
    const sort = await loader.getHarness(MatSortHarness);
    const [header] = await sort.getSortHeaders({ label: 'Last sign-in' });
    await header?.click();
    expect(await column('name')).toEqual(['Bram Lind', 'Aiko Sato', 'Ines Okafor (you)']);
  });

  it('filters by name, e-mail or role', async () => {
    const filter = await loader.getHarness(MatInputHarness.with({ placeholder: 'Name, e-mail, role or status' }));
    await filter.setValue('audit lead');
    expect(await column('name')).toEqual(['Aiko Sato']);
    await filter.setValue('nobody');
    expect(await column('name')).toEqual([]);
    expect(fixture.nativeElement.textContent).toContain('No team member matches “nobody”.');
  });

  it('changes a role from the row menu', async () => {
    await (await loader.getHarness(MatButtonHarness.with({ selector: '[aria-label="Actions for Aiko Sato"]' }))).click();
    const menu = await documentLoader.getHarness(MatMenuHarness.with({ selector: '[aria-label="Actions for Aiko Sato"]' }));
    await menu.clickItem({ text: /Change role/ }, { text: /Partner/ });

    const request = http.expectOne('/api/users/3');
    expect(request.request.method).toBe('PATCH');
    expect(request.request.body).toEqual({ role: 'partner' });
    request.flush({ ...TEAM[2], role: 'partner' });
    await fixture.whenStable();
    expect(await column('role')).toEqual(['Partner', 'Clinician', 'Administrator']);
  });

  it('deactivates only after confirmation', async () => {
    await (await loader.getHarness(MatButtonHarness.with({ selector: '[aria-label="Actions for Aiko Sato"]' }))).click();
    const menu = await documentLoader.getHarness(MatMenuHarness.with({ selector: '[aria-label="Actions for Aiko Sato"]' }));
    await menu.clickItem({ text: /Deactivate/ });

    const dialog = await documentLoader.getHarness(MatDialogHarness);
    expect(await dialog.getTitleText()).toBe('Deactivate Aiko Sato?');
    http.expectNone('/api/users/3');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Deactivate' }))).click();
    await fixture.whenStable();

    const request = http.expectOne('/api/users/3');
    expect(request.request.body).toEqual({ active: false });
    request.flush({ ...TEAM[2], active: false });
    await fixture.whenStable();
    expect((await column('status'))[0]).toContain('Inactive');
  });

  /** Opens a member's row menu. */
  async function rowMenu(name: string): Promise<MatMenuHarness> {
    await (await loader.getHarness(MatButtonHarness.with({ selector: `[aria-label="Actions for ${name}"]` }))).click();
    return documentLoader.getHarness(MatMenuHarness.with({ selector: `[aria-label="Actions for ${name}"]` }));
  }

  async function menuItems(name: string): Promise<string[]> {
    const menu = await rowMenu(name);
    const items = await Promise.all((await menu.getItems()).map((item) => item.getText()));
    await menu.close();
    return items;
  }

  it('shows whether each member signs in with one-time codes, as icon and words', async () => {
    expect(await column('protection')).toEqual(['verified_userCodes on', 'keyPassword only', 'verified_userCodes on']);
  });

  it('offers a reset of sign-in protection only for others whose codes are on', async () => {
    expect(await menuItems('Aiko Sato')).toEqual(expect.arrayContaining([expect.stringContaining('Reset sign-in protection')]));
    expect((await menuItems('Bram Lind')).some((item) => item.includes('Reset sign-in protection'))).toBe(false);
    const own = await menuItems('Ines Okafor');
    expect(own.some((item) => item.includes('Reset sign-in protection'))).toBe(false);
    expect(own.some((item) => item.includes('Set a new password'))).toBe(false);
    expect(own.some((item) => item.includes('Rename'))).toBe(true);
  });

  it('resets sign-in protection only after a confirmation that says what follows', async () => {
    await (await rowMenu('Aiko Sato')).clickItem({ text: /Reset sign-in protection/ });
    const dialog = await documentLoader.getHarness(MatDialogHarness);
    expect(await dialog.getTitleText()).toContain('Reset sign-in protection for Aiko Sato?');
    const text = await dialog.getContentText();
    expect(text).toContain('signed out on every device');
    expect(text).toContain('set up one-time codes again');
    http.expectNone('/api/users/3/second-factor');

    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Reset sign-in protection' }))).click();
    await fixture.whenStable();
    const request = http.expectOne('/api/users/3/second-factor');
    expect(request.request.method).toBe('DELETE');
    request.flush(null, { status: 204, statusText: 'No Content' });
    await fixture.whenStable();
    expect((await column('protection'))[0]).toContain('Password only');
  });

  it('leaves sign-in protection as it was when the reset is cancelled', async () => {
    await (await rowMenu('Aiko Sato')).clickItem({ text: /Reset sign-in protection/ });
    const dialog = await documentLoader.getHarness(MatDialogHarness);
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Cancel' }))).click();
    await fixture.whenStable();
    http.expectNone('/api/users/3/second-factor');
    expect((await column('protection'))[0]).toContain('Codes on');
  });

  it('signs another member out everywhere after a confirmation, and says how many sessions ended', async () => {
    expect((await menuItems('Ines Okafor')).some((item) => item.includes('Sign out everywhere'))).toBe(false);
    await (await rowMenu('Aiko Sato')).clickItem({ text: /Sign out everywhere/ });
    const dialog = await documentLoader.getHarness(MatDialogHarness);
    expect(await dialog.getTitleText()).toContain('Sign Aiko Sato out everywhere?');
    expect(await dialog.getContentText()).toContain('password and one-time codes stay');
    http.expectNone('/api/users/3/sessions');

    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Sign out everywhere' }))).click();
    await fixture.whenStable();
    const request = http.expectOne('/api/users/3/sessions');
    expect(request.request.method).toBe('DELETE');
    request.flush({ endedSessions: 2 });
    await fixture.whenStable();
    expect(document.body.textContent).toContain('Aiko Sato was signed out of 2 sessions.');
  });

  it('renames a member through the rename dialog and shows the new name in the list', async () => {
    await (await rowMenu('Bram Lind')).clickItem({ text: /Rename/ });
    const dialog = await documentLoader.getHarness(MatDialogHarness);
    expect(await dialog.getTitleText()).toBe('Rename Bram Lind');
    const input = await dialog.getHarness(MatInputHarness);
    await input.setValue('Dr Bram Lind');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Save name' }))).click();
    const request = http.expectOne('/api/users/2');
    expect(request.request.body).toEqual({ displayName: 'Dr Bram Lind' });
    request.flush({ ...TEAM[1], displayName: 'Dr Bram Lind' });
    await fixture.whenStable();
    expect(await column('name')).toEqual(['Aiko Sato', 'Dr Bram Lind', 'Ines Okafor (you)']);
  });

  it('opens the new-password dialog for another member', async () => {
    await (await rowMenu('Aiko Sato')).clickItem({ text: /Set a new password/ });
    const dialog = await documentLoader.getHarness(MatDialogHarness);
    expect(await dialog.getTitleText()).toBe('New password for Aiko Sato');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Cancel' }))).click();
    http.expectNone('/api/users/3');
  });

  it('changes nothing when the confirmation is cancelled', async () => {
    await (await loader.getHarness(MatButtonHarness.with({ selector: '[aria-label="Actions for Bram Lind"]' }))).click();
    const menu = await documentLoader.getHarness(MatMenuHarness.with({ selector: '[aria-label="Actions for Bram Lind"]' }));
    await menu.clickItem({ text: /Reactivate/ });
    const dialog = await documentLoader.getHarness(MatDialogHarness);
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Cancel' }))).click();
    http.expectNone('/api/users/2');
    expect((await column('status'))[1]).toContain('Inactive');
  });
});
