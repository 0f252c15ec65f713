import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSlideToggleHarness } from '@angular/material/slide-toggle/testing';
import { Router, provideRouter } from '@angular/router';
import type { SecondFactorPolicy } from '@tidemark/shared';
import { AuthSession } from '../auth-session';
import { SignIn } from './sign-in';

describe('SignIn', () => {
  let fixture: ComponentFixture<SignIn>;
  let loader: HarnessLoader;
  let http: HttpTestingController;
  let router: Router;

  /** Renders the page; the server says whether one-time codes are required or only offered (demo). */
  async function render(policy: SecondFactorPolicy): Promise<void> {
    TestBed.configureTestingModule({
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
    });
    fixture = TestBed.createComponent(SignIn);
    loader = TestbedHarnessEnvironment.loader(fixture);
    http = TestBed.inject(HttpTestingController);
    router = TestBed.inject(Router);
    http.expectOne({ method: 'GET', url: '/api/auth/sign-in-options' }).flush({ secondFactorPolicy: policy });
    await fixture.whenStable();
  }

  beforeEach(async () => {
    await render('required');
  });

  afterEach(() => http.verify());

  async function field(label: string): Promise<MatFormFieldHarness> {
    return loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));
  }

  async function input(label: string): Promise<MatInputHarness> {
    const control = await (await field(label)).getControl(MatInputHarness);
    if (!control) {
      throw new Error(`No input labelled ${label}`);
    }
    return control;
  }

  async function submit(): Promise<void> {
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Sign in' }))).click();
  }

  it('labels its fields "E-mail" and "Password" and names its button "Sign in"', async () => {
    expect(await (await input('E-mail')).getType()).toBe('email');
    expect(await (await input('Password')).getType()).toBe('password');
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: 'Sign in' }))).toHaveLength(1);
  });

  it('shows "required" errors and sends nothing when submitted empty', async () => {
    await submit();
    expect(await (await field('E-mail')).getTextErrors()).toEqual(['Enter your e-mail address.']);
    expect(await (await field('Password')).getTextErrors()).toEqual(['Enter your password.']);
    http.expectNone('/api/auth/login');
  });

  it('rejects a malformed e-mail address', async () => {
    await (await input('E-mail')).setValue('not-an-address');
    await (await input('Password')).setValue('secret');
    await submit();
    expect(await (await field('E-mail')).getTextErrors()).toEqual(['Enter a valid e-mail address.']);
    expect(await (await field('Password')).getTextErrors()).toEqual([]);
    http.expectNone('/api/auth/login');
  });

  it('posts the credentials and goes to the role home page', async () => {
    const navigate = vi.spyOn(router, 'navigateByUrl').mockResolvedValue(true);
    await (await input('E-mail')).setValue('lead@example.org');
    await (await input('Password')).setValue('a long passphrase');
    await submit();

    const request = http.expectOne('/api/auth/login');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({ email: 'lead@example.org', password: 'a long passphrase' });
    request.flush({ user: { id: 2, email: 'lead@example.org', displayName: 'Lee', role: 'audit_lead' } });
    await fixture.whenStable();

    expect(navigate).toHaveBeenCalledWith('/today');
  });

  it('returns to a local returnUrl but never to another site', async () => {
    const navigate = vi.spyOn(router, 'navigateByUrl').mockResolvedValue(true);
    fixture.componentRef.setInput('returnUrl', '//evil.example/steal');
    await (await input('E-mail')).setValue('admin@example.org');
    await (await input('Password')).setValue('a long passphrase');
    await submit();
    http.expectOne('/api/auth/login').flush({
      user: { id: 1, email: 'admin@example.org', displayName: 'Ada', role: 'admin' },
    });
    await fixture.whenStable();
    expect(navigate).toHaveBeenCalledWith('/cases');
  });

  it("shows the server's message in an alert when sign-in is refused", async () => {
    await (await input('E-mail')).setValue('lead@example.org');
    await (await input('Password')).setValue('wrong one');
    await submit();
    http
      .expectOne('/api/auth/login')
      .flush(
        { error: { code: 'unauthenticated', message: 'That e-mail and password do not match.' } },
        { status: 401, statusText: 'Unauthorized' },
      );
    await fixture.whenStable();

    const alert: HTMLElement | null = fixture.nativeElement.querySelector('[role="alert"]');
    expect(alert?.textContent).toContain('That e-mail and password do not match.');
    expect(await (await loader.getHarness(MatButtonHarness.with({ text: 'Sign in' }))).isDisabled()).toBe(false);
  });

  it('puts server field errors under their fields', async () => {
    await (await input('E-mail')).setValue('lead@example.org');
    await (await input('Password')).setValue('x');
    await submit();
    http.expectOne('/api/auth/login').flush(
      { error: { code: 'validation', message: 'Check the highlighted fields.', fields: { password: 'Too long.' } } },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();
    expect(await (await field('Password')).getTextErrors()).toEqual(['Too long.']);
  });

  it('shows the caution sentence in the footer', () => {
    const footer: HTMLElement | null = fixture.nativeElement.querySelector('footer');
    expect(footer?.textContent).toContain('Not a diagnostic tool');
  });
  it('says nothing about demo mode when one-time codes are required', () => {
    expect(fixture.nativeElement.querySelector('[role="note"]')).toBeNull();
  });

  describe('with one-time codes switched on', () => {
    async function passPasswordStep(): Promise<void> {
      await (await input('E-mail')).setValue('lead@example.org');
      await (await input('Password')).setValue('a long passphrase');
      await submit();
      http.expectOne('/api/auth/login').flush({
        user: { id: 2, email: 'lead@example.org', displayName: 'Lee', role: 'audit_lead' },
        secondFactor: 'pending',
      });
      await fixture.whenStable();
    }

    async function continueButton(): Promise<MatButtonHarness> {
      return loader.getHarness(MatButtonHarness.with({ text: 'Continue' }));
    }

    it('asks for the one-time code after the password instead of leaving the page', async () => {
      const navigate = vi.spyOn(router, 'navigateByUrl').mockResolvedValue(true);
      await passPasswordStep();
      expect(navigate).not.toHaveBeenCalled();
      expect(fixture.nativeElement.querySelector('h1')?.textContent).toContain('One more step');
      expect(await loader.getAllHarnesses(MatFormFieldHarness.with({ floatingLabelText: 'Password' }))).toHaveLength(0);
      expect(await (await input('One-time code')).getValue()).toBe('');
    });

    it('checks the code format before sending anything', async () => {
      await passPasswordStep();
      await (await input('One-time code')).setValue('12ab');
      await (await continueButton()).click();
      expect(await (await field('One-time code')).getTextErrors()).toEqual(['Enter the 6-digit code from your app.']);
      http.expectNone('/api/auth/second-factor/verify');
    });

    it('sends the code and goes to the role home page once the server accepts it', async () => {
      const navigate = vi.spyOn(router, 'navigateByUrl').mockResolvedValue(true);
      await passPasswordStep();
      await (await input('One-time code')).setValue('123 456');
      await (await continueButton()).click();
      const request = http.expectOne('/api/auth/second-factor/verify');
      expect(request.request.body).toEqual({ method: 'one-time-code', code: '123 456' });
      request.flush({ user: { id: 2, email: 'lead@example.org', displayName: 'Lee', role: 'audit_lead' }, secondFactor: 'verified' });
      await fixture.whenStable();
      expect(navigate).toHaveBeenCalledWith('/today');
      expect(TestBed.inject(AuthSession).isSignedIn()).toBe(true);
    });

    it("shows the server's refusal under the code field", async () => {
      await passPasswordStep();
      await (await input('One-time code')).setValue('654321');
      await (await continueButton()).click();
      http.expectOne('/api/auth/second-factor/verify').flush(
        { error: { code: 'second_factor_invalid', message: 'Not right.', fields: { code: 'That code is not right.' } } },
        { status: 401, statusText: 'Unauthorized' },
      );
      await fixture.whenStable();
      expect(await (await field('One-time code')).getTextErrors()).toEqual(['That code is not right.']);
      expect(TestBed.inject(AuthSession).isSignedIn()).toBe(false);
    });

    it('switches to a recovery code and sends it as one', async () => {
      vi.spyOn(router, 'navigateByUrl').mockResolvedValue(true);
      await passPasswordStep();
      await (await loader.getHarness(MatSlideToggleHarness.with({ label: /recovery code/ }))).check();
      await (await input('Recovery code')).setValue('abcd-efgh-jkmn-pqrs-tvwx-yz01-2345');
      await (await continueButton()).click();
      const request = http.expectOne('/api/auth/second-factor/verify');
      expect(request.request.body).toEqual({ method: 'recovery-code', code: 'abcd-efgh-jkmn-pqrs-tvwx-yz01-2345' });
      request.flush({ user: { id: 2, email: 'lead@example.org', displayName: 'Lee', role: 'audit_lead' }, secondFactor: 'verified' });
    });

    it('starts over with the password, signing the half-finished session out', async () => {
      await passPasswordStep();
      await (await loader.getHarness(MatButtonHarness.with({ text: 'Start over with the password' }))).click();
      http.expectOne({ method: 'POST', url: '/api/auth/logout' }).flush(null, { status: 204, statusText: 'No Content' });
      http.expectOne('/api/auth/me').flush(null, { status: 401, statusText: 'Unauthorized' });
      await fixture.whenStable();
      expect(await (await input('Password')).getValue()).toBe('');
      expect(fixture.nativeElement.querySelector('h1')?.textContent).toContain('Sign in');
    });
  });

  it('sends an administrator who must set up one-time codes to Sign-in protection', async () => {
    const navigate = vi.spyOn(router, 'navigateByUrl').mockResolvedValue(true);
    await (await input('E-mail')).setValue('admin@example.org');
    await (await input('Password')).setValue('a long passphrase');
    await submit();
    http.expectOne('/api/auth/login').flush({
      user: { id: 1, email: 'admin@example.org', displayName: 'Ada', role: 'admin' },
      secondFactor: 'enrolment-required',
    });
    await fixture.whenStable();
    expect(navigate).toHaveBeenCalledWith('/account/security');
  });
});

describe('SignIn in demo mode', () => {
  it('says that one-time codes are offered but not required', async () => {
    TestBed.configureTestingModule({ providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()] });
    const fixture = TestBed.createComponent(SignIn);
    TestBed.inject(HttpTestingController).expectOne('/api/auth/sign-in-options').flush({ secondFactorPolicy: 'offered' });
    await fixture.whenStable();
    const note: HTMLElement | null = fixture.nativeElement.querySelector('[role="note"]');
    expect(note?.textContent).toContain('Demo mode');
    expect(note?.textContent).toContain('no role has to use them');
  });
});
