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
    email: 'ines@harbour.test',
    displayName: 'Ines Okafor',
    role: 'admin',
    active: true,
    createdAt: '2026-01-02T08:00:00.000Z',
    lastSignInAt: '2026-03-04T09:15:00.000Z',
  },
  {
    id: 2,
    email: 'bram@harbour.test',
    displayName: 'Bram Lind',
    role: 'clinician',
    active: false,
    createdAt: '2026-01-03T08:00:00.000Z',
    lastSignInAt: null,
  },
  {
    id: 3,
    email: 'aiko@harbour.test',
    displayName: 'Aiko Sato',
    role: 'audit_lead',
    active: true,
    createdAt: '2026-01-04T08:00:00.000Z',
    lastSignInAt: '2026-03-01T10:00:00.000Z',
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
