import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { PASSWORD_MIN_LENGTH } from '@tidemark/shared';
import { AddMemberDialog } from './add-member-dialog';

describe('AddMemberDialog', () => {
  let fixture: ComponentFixture<AddMemberDialog>;
  let loader: HarnessLoader;
  let http: HttpTestingController;
  const close = vi.fn();

  beforeEach(async () => {
    close.mockReset();
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), { provide: MatDialogRef, useValue: { close } }],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(AddMemberDialog);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  const field = (label: string) => loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));

  async function fill(values: { name: string; email: string; password: string; role?: string }): Promise<void> {
    const [name, email, password] = await loader.getAllHarnesses(MatInputHarness);
    await name?.setValue(values.name);
    await email?.setValue(values.email);
    await password?.setValue(values.password);
    if (values.role) {
      const select = await loader.getHarness(MatSelectHarness);
      await select.open();
      await select.clickOptions({ text: values.role });
    }
  }

  const submit = async () => (await loader.getHarness(MatButtonHarness.with({ text: 'Add team member' }))).click();

  it('explains the password rule and refuses a short password without calling the server', async () => {
    expect(await (await field('Initial password')).getTextHints()).toEqual([
      `At least ${PASSWORD_MIN_LENGTH} characters. Share it with them privately.`,
    ]);
    await fill({ name: 'Noor Aziz', email: 'noor@example.org', password: 'short' });
    await submit();
    expect(await (await field('Initial password')).getTextErrors()).toEqual([
      `Use at least ${PASSWORD_MIN_LENGTH} characters.`,
    ]);
    http.expectNone('/api/users');
  });

  it('requires a name and a valid e-mail', async () => {
    await fill({ name: '', email: 'noor-at-harbour', password: 'a sufficiently long one' });
    await submit();
    expect(await (await field('Name')).getTextErrors()).toEqual(['Enter a name.']);
    expect(await (await field('E-mail')).getTextErrors()).toEqual(['Enter a valid e-mail address.']);
    http.expectNone('/api/users');
  });

  it('creates the member with the chosen role and closes with it', async () => {
    await fill({ name: 'Noor Aziz', email: 'noor@example.org', password: 'a sufficiently long one', role: 'Partner' });
    await submit();
    const request = http.expectOne('/api/users');
    expect(request.request.body).toEqual({
      displayName: 'Noor Aziz',
      email: 'noor@example.org',
      role: 'partner',
      password: 'a sufficiently long one',
    });
    const created = { id: 9, email: 'noor@example.org', displayName: 'Noor Aziz', role: 'partner', active: true, createdAt: '2026-03-01T00:00:00Z', lastSignInAt: null };
    request.flush(created, { status: 201, statusText: 'Created' });
    expect(close).toHaveBeenCalledWith(created);
  });

  it("shows the server's field errors under their fields", async () => {
    await fill({ name: 'Noor Aziz', email: 'noor@example.org', password: 'password1234' });
    await submit();
    http.expectOne('/api/users').flush(
      { error: { code: 'validation', message: 'Check the fields.', fields: { password: 'That password is too common.' } } },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();
    expect(await (await field('Initial password')).getTextErrors()).toEqual(['That password is too common.']);
    expect(close).not.toHaveBeenCalled();
  });

  it('shows a taken e-mail address on the e-mail field', async () => {
    await fill({ name: 'Noor Aziz', email: 'ines@example.org', password: 'a sufficiently long one' });
    await submit();
    http
      .expectOne('/api/users')
      .flush({ error: { code: 'conflict', message: 'That e-mail address is already in use.' } }, { status: 409, statusText: 'Conflict' });
    await fixture.whenStable();
    expect(await (await field('E-mail')).getTextErrors()).toEqual(['That e-mail address is already in use.']);
  });
});
