import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH, type UserView } from '@tidemark/shared';
import { PASSWORDS_DIFFER } from '../../../shared/forms/matching-password';
import { MemberPasswordDialog } from './member-password-dialog';

const MEMBER: UserView = {
  id: 14,
  email: 'mara.quinn@example.org',
  displayName: 'Mara Quinn',
  role: 'partner',
  active: true,
  createdAt: '2026-01-05T09:00:00.000Z',
  lastSignInAt: '2026-02-01T09:00:00.000Z',
  secondFactorEnabled: true,
};

describe('MemberPasswordDialog', () => {
  let fixture: ComponentFixture<MemberPasswordDialog>;
  let loader: HarnessLoader;
  let http: HttpTestingController;
  const close = vi.fn();

  beforeEach(async () => {
    close.mockReset();
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), { provide: MatDialogRef, useValue: { close } }, { provide: MAT_DIALOG_DATA, useValue: MEMBER }],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(MemberPasswordDialog);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  const field = (label: string) => loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));
  const submit = async () => (await loader.getHarness(MatButtonHarness.with({ text: 'Set password' }))).click();

  async function type(password: string, repeat: string): Promise<void> {
    const [first, second] = await loader.getAllHarnesses(MatInputHarness);
    await first?.setValue(password);
    await second?.setValue(repeat);
  }

  it('states the password rules and that the member is signed out everywhere', () => {
    const text: string = fixture.nativeElement.textContent;
    // shared/schemas/user.ts: PASSWORD_MIN_LENGTH and PASSWORD_MAX_LENGTH; server/auth/common-passwords.ts: the common list.
    expect(text).toContain(`At least ${PASSWORD_MIN_LENGTH} characters, at most ${PASSWORD_MAX_LENGTH}.`);
    expect(text).toContain('commonly used');
    expect(text).toContain('Saving signs Mara Quinn out on every device.');
  });

  it('refuses a short password with the shared schema’s words, without calling the server', async () => {
    await type('short', 'short');
    await submit();
    expect(await (await field('New password')).getTextErrors()).toEqual([`Use at least ${PASSWORD_MIN_LENGTH} characters.`]);
    http.expectNone('/api/users/14');
  });

  it('asks for the same password twice', async () => {
    await type('tidal-margin-passphrase', '');
    await submit();
    expect(await (await field('Type it again')).getTextErrors()).toEqual(['Type the new password a second time.']);
    await type('tidal-margin-passphrase', 'tidal-margin-passphrasf');
    await submit();
    expect(await (await field('Type it again')).getTextErrors()).toEqual([PASSWORDS_DIFFER]);
    http.expectNone('/api/users/14');
  });

  it('looks at the repeat again when the first entry changes to match it', async () => {
    await type('tidal-margin-passphrase', 'tidal-margin-passphrase-2');
    await submit();
    expect(await (await field('Type it again')).getTextErrors()).toEqual([PASSWORDS_DIFFER]);
    const [first] = await loader.getAllHarnesses(MatInputHarness);
    await first?.setValue('tidal-margin-passphrase-2');
    expect(await (await field('Type it again')).getTextErrors()).toEqual([]);
  });

  it('sends only the password and closes with the member', async () => {
    await type('tidal-margin-passphrase', 'tidal-margin-passphrase');
    await submit();
    const request = http.expectOne('/api/users/14');
    expect(request.request.method).toBe('PATCH');
    expect(request.request.body).toEqual({ password: 'tidal-margin-passphrase' });
    request.flush(MEMBER);
    expect(close).toHaveBeenCalledWith(MEMBER);
  });

  it('shows the server’s common-password refusal under the password', async () => {
    await type('password1234', 'password1234');
    await submit();
    http
      .expectOne('/api/users/14')
      .flush({ error: { code: 'validation', message: 'Choose a less common password.', fields: { password: 'This password is on a list of common passwords. Choose another.' } } }, { status: 400, statusText: 'Bad Request' });
    await fixture.whenStable();
    expect(await (await field('New password')).getTextErrors()).toEqual(['This password is on a list of common passwords. Choose another.']);
    expect(close).not.toHaveBeenCalled();
  });

  it('shows and hides what was typed', async () => {
    const toggle = await loader.getHarness(MatButtonHarness.with({ selector: '[aria-label="Show password"]' }));
    await toggle.click();
    const [first, second] = await loader.getAllHarnesses(MatInputHarness);
    expect(await first?.getType()).toBe('text');
    expect(await second?.getType()).toBe('text');
  });
});
