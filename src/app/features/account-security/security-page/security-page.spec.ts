import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { Router, provideRouter } from '@angular/router';
import type { SecondFactorEnrolment, SecondFactorState, SecondFactorStatus } from '@tidemark/shared';
import { StubAuthSession, personWithRole, provideStubAuthSession } from '../../../core/auth/testing/stub-auth-session';
import { SecurityPage } from './security-page';

const OFF_REQUIRED: SecondFactorStatus = { isEnabled: false, enabledAt: null, recoveryCodesLeft: 0, isRequired: true, policy: 'required' };
const ON_OPTIONAL: SecondFactorStatus = { isEnabled: true, enabledAt: '2026-03-02T09:30:00.000Z', recoveryCodesLeft: 2, isRequired: false, policy: 'required' };

/** A made-up enrolment; the image is a tiny inline SVG, not a real QR code. */
const ENROLMENT: SecondFactorEnrolment = {
  otpauthUri: 'otpauth://totp/Tidemark:admin%40tidemark.test?secret=JBSWY3DPEHPK3PXPJBSWY3DPEHPK3PXP&issuer=Tidemark',
  secret: 'JBSWY3DPEHPK3PXPJBSWY3DPEHPK3PXP',
  qrCodeDataUrl: 'data:image/svg+xml;base64,PHN2ZyB4bWxucz0iaHR0cDovL3d3dy53My5vcmcvMjAwMC9zdmciLz4=',
  digits: 6,
  periodSeconds: 30,
};

const CODES = Array.from({ length: 10 }, (_, index) => `AAAA-BBBB-CCCC-${String(index).padStart(4, '0')}`);

describe('SecurityPage', () => {
  let fixture: ComponentFixture<SecurityPage>;
  let loader: HarnessLoader;
  let documentLoader: HarnessLoader;
  let http: HttpTestingController;

  async function render(status: SecondFactorStatus, secondFactor: SecondFactorState): Promise<void> {
    TestBed.configureTestingModule({
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting(), provideStubAuthSession(personWithRole('admin'), secondFactor)],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(SecurityPage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    documentLoader = TestbedHarnessEnvironment.documentRootLoader(fixture);
    http.expectOne('/api/auth/second-factor').flush(status);
    await fixture.whenStable();
    // The sessions panel reads its list, except while codes must first be set up.
    if (secondFactor !== 'enrolment-required') {
      http.expectOne('/api/auth/sessions').flush([]);
      await fixture.whenStable();
    }
  }

  afterEach(() => http.verify());

  function text(): string {
    return (fixture.nativeElement as HTMLElement).textContent ?? '';
  }

  async function button(label: string | RegExp, from: HarnessLoader = loader): Promise<MatButtonHarness> {
    return from.getHarness(MatButtonHarness.with({ text: label }));
  }

  describe('for an administrator who must set up codes', () => {
    beforeEach(async () => {
      await render(OFF_REQUIRED, 'enrolment-required');
    });

    it('says the role needs one-time codes and offers to set them up', async () => {
      expect(text()).toContain('As Administrator you need one-time codes');
      expect(text()).toContain('One-time codes are off');
      expect(await button(/Set up one-time codes/)).toBeTruthy();
    });

    it('keeps the password form and the sessions away until codes are on (the server lets nothing else through before)', () => {
      expect(fixture.nativeElement.querySelector('tm-password-panel')).toBeNull();
      expect(fixture.nativeElement.querySelector('tm-sessions-panel')).toBeNull();
      http.expectNone('/api/auth/sessions');
    });

    it('shows the QR code, the key in groups of four and asks for the first code', async () => {
      await (await button(/Set up one-time codes/)).click();
      const request = http.expectOne('/api/auth/second-factor/enrolment');
      expect(request.request.method).toBe('POST');
      request.flush(ENROLMENT);
      await fixture.whenStable();

      const image: HTMLImageElement | null = fixture.nativeElement.querySelector('img.qr');
      expect(image?.getAttribute('src')).toBe(ENROLMENT.qrCodeDataUrl);
      expect(image?.alt).toContain('QR code');
      expect(fixture.nativeElement.querySelector('.secret code')?.textContent).toBe('JBSW Y3DP EHPK 3PXP JBSW Y3DP EHPK 3PXP');
      expect(text()).toContain('6 digits, a new code every 30 seconds');

      const code = await loader.getHarness(MatInputHarness.with({ ancestor: 'tm-enrolment-panel' }));
      await code.setValue('12345');
      await (await button('Switch on one-time codes')).click();
      const field = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'One-time code' }));
      expect(await field.getTextErrors()).toEqual(['Enter the 6-digit code from your app.']);
      http.expectNone('/api/auth/second-factor/enrolment/confirm');
    });

    it('switches codes on, shows the ten recovery codes once and then opens the app', async () => {
      const navigate = vi.spyOn(TestBed.inject(Router), 'navigateByUrl').mockResolvedValue(true);
      await (await button(/Set up one-time codes/)).click();
      http.expectOne('/api/auth/second-factor/enrolment').flush(ENROLMENT);
      await fixture.whenStable();

      await (await loader.getHarness(MatInputHarness.with({ ancestor: 'tm-enrolment-panel' }))).setValue('123456');
      await (await button('Switch on one-time codes')).click();
      const confirm = http.expectOne('/api/auth/second-factor/enrolment/confirm');
      expect(confirm.request.body).toEqual({ code: '123456' });
      confirm.flush({ recoveryCodes: CODES, session: { user: personWithRole('admin'), secondFactor: 'verified' } });
      http.expectOne('/api/auth/second-factor').flush({ ...OFF_REQUIRED, isEnabled: true, enabledAt: '2026-03-02T09:30:00.000Z', recoveryCodesLeft: 10 });
      await fixture.whenStable();

      const listed = Array.from(fixture.nativeElement.querySelectorAll('tm-recovery-codes-panel li') as NodeListOf<HTMLElement>).map((item) => item.textContent?.trim());
      expect(listed).toEqual(CODES);
      expect(text()).toContain('This is the only time Tidemark shows them');
      expect(TestBed.inject(StubAuthSession).secondFactor()).toBe('verified');
      // Codes are on: the rest of the page (password, sessions) opens and reads the sessions.
      http.expectOne('/api/auth/sessions').flush([]);
      await fixture.whenStable();

      await (await button('I have kept them safe')).click();
      expect(fixture.nativeElement.querySelector('tm-recovery-codes-panel')).toBeNull();
      expect(text()).toContain('One-time codes are on');
      expect(navigate).toHaveBeenCalledWith('/cases');
    });

    it('shows a wrong first code under the field', async () => {
      await (await button(/Set up one-time codes/)).click();
      http.expectOne('/api/auth/second-factor/enrolment').flush(ENROLMENT);
      await fixture.whenStable();
      await (await loader.getHarness(MatInputHarness.with({ ancestor: 'tm-enrolment-panel' }))).setValue('000000');
      await (await button('Switch on one-time codes')).click();
      http.expectOne('/api/auth/second-factor/enrolment/confirm').flush(
        { error: { code: 'second_factor_invalid', message: 'No.', fields: { code: 'That code is not right.' } } },
        { status: 401, statusText: 'Unauthorized' },
      );
      await fixture.whenStable();
      const field = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'One-time code' }));
      expect(await field.getTextErrors()).toEqual(['That code is not right.']);
    });
  });

  describe('for someone with codes on whose role may switch them off', () => {
    beforeEach(async () => {
      await render(ON_OPTIONAL, 'verified');
    });

    it('shows the state, warns about few recovery codes and offers both actions', async () => {
      expect(text()).toContain('One-time codes are on');
      expect(text()).toContain('2 unused recovery codes left.');
      expect(text()).toContain('Make new ones before they run out.');
      expect(await button(/New recovery codes/)).toBeTruthy();
      expect(await button('Switch off one-time codes')).toBeTruthy();
    });

    it('offers to change one’s own password', async () => {
      expect(fixture.nativeElement.querySelector('tm-password-panel')).not.toBeNull();
      expect(await button('Change password')).toBeTruthy();
    });

    it('asks for a current code, then shows the new recovery codes', async () => {
      await (await button(/New recovery codes/)).click();
      const dialog = await documentLoader.getHarness(MatDialogHarness);
      expect(await dialog.getTitleText()).toBe('Make new recovery codes');
      await (await documentLoader.getHarness(MatInputHarness.with({ ancestor: 'tm-code-prompt-dialog' }))).setValue('654321');
      await (await button('Make new codes', documentLoader)).click();
      const request = http.expectOne('/api/auth/second-factor/recovery-codes');
      expect(request.request.body).toEqual({ code: '654321' });
      request.flush({ recoveryCodes: CODES });
      // The dialog closes first; the page then shows the codes and reloads the status.
      await fixture.whenStable();
      http.expectOne('/api/auth/second-factor').flush({ ...ON_OPTIONAL, recoveryCodesLeft: 10 });
      await fixture.whenStable();
      expect(await documentLoader.getAllHarnesses(MatDialogHarness)).toHaveLength(0);
      expect(fixture.nativeElement.querySelectorAll('tm-recovery-codes-panel li')).toHaveLength(10);
    });

    it('keeps the dialog open with the reason when the code is refused', async () => {
      await (await button('Switch off one-time codes')).click();
      await (await documentLoader.getHarness(MatInputHarness.with({ ancestor: 'tm-code-prompt-dialog' }))).setValue('111111');
      await (await button('Switch off', documentLoader)).click();
      http.expectOne('/api/auth/second-factor/disable').flush(
        { error: { code: 'rate_limited', message: 'Too many wrong codes. Try again in up to 15 minutes.' } },
        { status: 429, statusText: 'Too Many Requests' },
      );
      await fixture.whenStable();
      const dialog = await documentLoader.getHarness(MatDialogHarness);
      expect(await dialog.getText()).toContain('Too many wrong codes.');
    });

    it('switches codes off and updates the session', async () => {
      await (await button('Switch off one-time codes')).click();
      await (await documentLoader.getHarness(MatInputHarness.with({ ancestor: 'tm-code-prompt-dialog' }))).setValue('222222');
      await (await button('Switch off', documentLoader)).click();
      http.expectOne('/api/auth/second-factor/disable').flush({ user: personWithRole('admin'), secondFactor: 'none' });
      await fixture.whenStable();
      http.expectOne('/api/auth/second-factor').flush({ ...ON_OPTIONAL, isEnabled: false, enabledAt: null, recoveryCodesLeft: 0 });
      await fixture.whenStable();
      expect(TestBed.inject(StubAuthSession).secondFactor()).toBe('none');
      expect(text()).toContain('One-time codes are off.');
    });
  });

  it('does not offer switching off to a role that must keep codes', async () => {
    await render({ ...ON_OPTIONAL, isRequired: true, recoveryCodesLeft: 8 }, 'verified');
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: 'Switch off one-time codes' }))).toHaveLength(0);
    expect(text()).toContain('ask an administrator to reset them');
    expect(text()).not.toContain('Make new ones before they run out.');
  });
});
