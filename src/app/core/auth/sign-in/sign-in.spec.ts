import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { Router, provideRouter } from '@angular/router';
import { SignIn } from './sign-in';

describe('SignIn', () => {
  let fixture: ComponentFixture<SignIn>;
  let loader: HarnessLoader;
  let http: HttpTestingController;
  let router: Router;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
    });
    fixture = TestBed.createComponent(SignIn);
    loader = TestbedHarnessEnvironment.loader(fixture);
    http = TestBed.inject(HttpTestingController);
    router = TestBed.inject(Router);
    await fixture.whenStable();
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
});
