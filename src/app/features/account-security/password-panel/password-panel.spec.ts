import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { PASSWORD_MIN_LENGTH } from '@tidemark/shared';
import { PASSWORDS_DIFFER } from '../../../shared/forms/matching-password';
import { PasswordPanel, passwordChangedSentence } from './password-panel';

const URL = '/api/auth/password';

describe('PasswordPanel', () => {
  let fixture: ComponentFixture<PasswordPanel>;
  let loader: HarnessLoader;
  let http: HttpTestingController;

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(PasswordPanel);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  const field = (label: string) => loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));
  const input = async (label: string) => (await (await field(label)).getControl(MatInputHarness)) as MatInputHarness;
  const submit = async () => (await loader.getHarness(MatButtonHarness.with({ text: 'Change password' }))).click();
  const text = (): string => fixture.nativeElement.textContent;

  async function fill(current: string, next: string, repeat: string): Promise<void> {
    await (await input('Current password')).setValue(current);
    await (await input('New password')).setValue(next);
    await (await input('New password again')).setValue(repeat);
  }

  it('offers the browser’s password manager the right fields: current-password, then new-password twice', async () => {
    const fields = fixture.nativeElement.querySelectorAll('input') as NodeListOf<HTMLInputElement>;
    expect([...fields].map((element) => [element.type, element.autocomplete])).toEqual([
      ['password', 'current-password'],
      ['password', 'new-password'],
      ['password', 'new-password'],
    ]);
  });

  it('refuses a short new password, a repeat that differs and a missing current one without calling the server', async () => {
    await fill('', 'short', 'shorter');
    await submit();
    expect(await (await field('Current password')).getTextErrors()).toEqual(['Enter your current password.']);
    expect(await (await field('New password')).getTextErrors()).toEqual([`Use at least ${PASSWORD_MIN_LENGTH} characters.`]);
    expect(await (await field('New password again')).getTextErrors()).toEqual([PASSWORDS_DIFFER]);
    http.expectNone(URL);
  });

  it('refuses the current password as the new one', async () => {
    await fill('harbour-lights-passphrase', 'harbour-lights-passphrase', 'harbour-lights-passphrase');
    await submit();
    expect(await (await field('New password')).getTextErrors()).toEqual(['Choose a password different from the current one.']);
    http.expectNone(URL);
  });

  it('sends both passwords, then clears the form and says how many other sessions ended', async () => {
    await fill('old-harbour-passphrase', 'new-tidal-passphrase-9', 'new-tidal-passphrase-9');
    await submit();
    const request = http.expectOne(URL);
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({ currentPassword: 'old-harbour-passphrase', newPassword: 'new-tidal-passphrase-9' });
    request.flush({ endedSessions: 2 });
    await fixture.whenStable();
    expect(text()).toContain('Password changed. Your 2 other open sessions were signed out.');
    expect(await (await input('Current password')).getValue()).toBe('');
    expect(await (await input('New password')).getValue()).toBe('');
    // A cleared form shows no "required" errors.
    expect(await (await field('Current password')).getTextErrors()).toEqual([]);
  });

  it('shows the server’s field errors under their fields', async () => {
    await fill('not-my-password-at-all', 'password1234-x', 'password1234-x');
    await submit();
    http.expectOne(URL).flush(
      { error: { code: 'validation', message: 'Your current password is not right.', fields: { currentPassword: 'This is not your current password.' } } },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();
    expect(await (await field('Current password')).getTextErrors()).toEqual(['This is not your current password.']);
    expect(text()).not.toContain('Password changed.');
  });

  it('says a refusal that belongs to no field, such as too many attempts, above the button', async () => {
    await fill('not-my-password-at-all', 'new-tidal-passphrase-9', 'new-tidal-passphrase-9');
    await submit();
    http.expectOne(URL).flush(
      { error: { code: 'rate_limited', message: 'Too many refused password changes. Try again in up to 15 minutes.' } },
      { status: 429, statusText: 'Too Many Requests' },
    );
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('[role="alert"]').textContent).toContain('Too many refused password changes');
  });

  it('words the outcome for none, one and several ended sessions', () => {
    expect(passwordChangedSentence({ endedSessions: 0 })).toBe('Password changed. You had no other open sessions. A confirmation went to your e-mail address.');
    expect(passwordChangedSentence({ endedSessions: 1 })).toBe('Password changed. Your other open session was signed out. A confirmation went to your e-mail address.');
    expect(passwordChangedSentence({ endedSessions: 3 })).toContain('Your 3 other open sessions were signed out.');
  });
});
