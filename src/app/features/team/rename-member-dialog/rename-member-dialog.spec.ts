import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import type { UserView } from '@tidemark/shared';
import { RenameMemberDialog } from './rename-member-dialog';

const MEMBER: UserView = {
  id: 12,
  email: 'rowan.hale@example.org',
  displayName: 'Rowan Hale',
  role: 'clinician',
  active: true,
  createdAt: '2026-01-05T09:00:00.000Z',
  lastSignInAt: null,
  secondFactorEnabled: false,
};

describe('RenameMemberDialog', () => {
  let fixture: ComponentFixture<RenameMemberDialog>;
  let loader: HarnessLoader;
  let http: HttpTestingController;
  const close = vi.fn();

  beforeEach(async () => {
    close.mockReset();
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), { provide: MatDialogRef, useValue: { close } }, { provide: MAT_DIALOG_DATA, useValue: MEMBER }],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(RenameMemberDialog);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  const nameField = () => loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Name' }));
  const save = async () => (await loader.getHarness(MatButtonHarness.with({ text: 'Save name' }))).click();

  it('starts from the current name', async () => {
    expect(await (await loader.getHarness(MatInputHarness)).getValue()).toBe('Rowan Hale');
  });

  it('refuses an empty name with the shared schema’s words, without calling the server', async () => {
    await (await loader.getHarness(MatInputHarness)).setValue('   ');
    await save();
    // shared/schemas/user.ts displayNameSchema: "Enter a name."
    expect(await (await nameField()).getTextErrors()).toEqual(['Enter a name.']);
    http.expectNone('/api/users/12');
    expect(close).not.toHaveBeenCalled();
  });

  it('closes without a call when the name did not change', async () => {
    await (await loader.getHarness(MatInputHarness)).setValue(' Rowan Hale ');
    await save();
    http.expectNone('/api/users/12');
    expect(close).toHaveBeenCalledWith();
  });

  it('saves the trimmed new name and closes with the updated member', async () => {
    await (await loader.getHarness(MatInputHarness)).setValue('  Dr Rowan Hale ');
    await save();
    const request = http.expectOne('/api/users/12');
    expect(request.request.method).toBe('PATCH');
    expect(request.request.body).toEqual({ displayName: 'Dr Rowan Hale' });
    const updated = { ...MEMBER, displayName: 'Dr Rowan Hale' };
    request.flush(updated);
    expect(close).toHaveBeenCalledWith(updated);
  });

  it('shows the server’s field message under the name, and another failure as a sentence', async () => {
    await (await loader.getHarness(MatInputHarness)).setValue('Dr Rowan Hale');
    await save();
    http.expectOne('/api/users/12').flush({ error: { code: 'validation', message: 'Check the fields.', fields: { displayName: 'Use at most 120 characters.' } } }, { status: 400, statusText: 'Bad Request' });
    await fixture.whenStable();
    expect(await (await nameField()).getTextErrors()).toEqual(['Use at most 120 characters.']);

    await (await loader.getHarness(MatInputHarness)).setValue('Dr R. Hale');
    await save();
    http.expectOne('/api/users/12').flush({ error: { code: 'not_found', message: 'The team member was not found.' } }, { status: 404, statusText: 'Not Found' });
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('[role="alert"]').textContent).toContain('That record could not be found.');
    expect(close).not.toHaveBeenCalled();
  });
});
