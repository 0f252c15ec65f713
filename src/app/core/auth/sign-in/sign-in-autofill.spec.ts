import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { SignIn } from './sign-in';

/*
 * Password managers and paste work on the sign-in page (OWASP ASVS 5.0 6.2.7; NIST SP 800-63B
 * §3.1.1.2, "allow the use of password managers and autofill", "permit the pasting"). Browsers and
 * password managers find the fields by their autocomplete tokens (WHATWG HTML, "Autofill":
 * `username`, `current-password`); nothing may cancel a paste, make the fields read-only or cut a
 * long generated password short.
 */

describe('SignIn works with password managers and paste', () => {
  let fixture: ComponentFixture<SignIn>;
  let http: HttpTestingController;

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()] });
    fixture = TestBed.createComponent(SignIn);
    http = TestBed.inject(HttpTestingController);
    http.expectOne('/api/auth/sign-in-options').flush({ secondFactorPolicy: 'required' });
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  function field(name: 'email' | 'password'): HTMLInputElement {
    const input = (fixture.nativeElement as HTMLElement).querySelector<HTMLInputElement>(`input[formcontrolname="${name}"]`);
    if (!input) throw new Error(`No ${name} field`);
    return input;
  }

  /** Pastes as a browser does: a cancelable paste event, then (if not cancelled) the text lands and an input event follows. */
  function paste(input: HTMLInputElement, text: string): boolean {
    const isAllowed = input.dispatchEvent(new Event('paste', { bubbles: true, cancelable: true }));
    if (isAllowed) {
      input.value = text;
      input.dispatchEvent(new Event('input', { bubbles: true }));
    }
    return isAllowed;
  }

  it('marks the fields for autofill: username for the e-mail, current-password for the password', () => {
    expect(field('email').getAttribute('autocomplete')).toBe('username');
    expect(field('email').type).toBe('email');
    expect(field('password').getAttribute('autocomplete')).toBe('current-password');
    expect(field('password').type).toBe('password');
  });

  it('lets a long generated password be pasted and sends it unchanged', async () => {
    // 64 characters of the kind password managers generate, with spaces and symbols (the server allows up to 256).
    const generated = 'Vq7#mZ p!x2$Lk9&Rw4*Tb6(Hn1)Yd8_Gs3+Jf5=Cu0~Ea-Pz Qo;Wi:Xr<Mt>Nk';
    for (const name of ['email', 'password'] as const) {
      expect(field(name).readOnly, name).toBe(false);
      // -1 is "no maxlength attribute" (WHATWG HTML, the maxLength IDL attribute).
      expect(field(name).maxLength === -1 || field(name).maxLength >= 256, name).toBe(true);
      expect(field(name).getAttribute('onpaste'), name).toBeNull();
    }
    expect(paste(field('email'), 'lead@example.org')).toBe(true);
    expect(paste(field('password'), generated)).toBe(true);
    await fixture.whenStable();
    (fixture.nativeElement as HTMLElement).querySelector<HTMLButtonElement>('button[type="submit"]')?.click();
    const request = http.expectOne('/api/auth/login');
    expect(request.request.body).toEqual({ email: 'lead@example.org', password: generated });
    request.flush({ error: { code: 'unauthenticated', message: 'No.' } }, { status: 401, statusText: 'Unauthorized' });
  });
});
