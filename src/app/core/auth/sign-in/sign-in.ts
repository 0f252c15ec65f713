import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, input, signal } from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { Router } from '@angular/router';
import { loginSchema, type SessionUser } from '@tidemark/shared';
import { catchError, of } from 'rxjs';
import { ClinicalCaution } from '../../../shared/clinical-caution/clinical-caution';
import { SERVER_ERROR, fieldMessage, zodValidator } from '../../../shared/forms/zod-validator';
import { Wordmark } from '../../../shared/wordmark/wordmark';
import { apiErrorDetails } from '../../http/api-error-details';
import { describeHttpError } from '../../http/describe-http-error';
import { homePathFor } from '../../shell/navigation';
import { ACCOUNT_SECURITY_PATH } from '../account-security-path';
import { AuthSession } from '../auth-session';
import { CodeStep } from '../code-step/code-step';
import { SIGN_IN_PATH } from '../sign-in-path';
import { VisibilityToggle } from '../../../shared/forms/visibility-toggle/visibility-toggle';

/** The sign-in form's controls. */
interface SignInForm {
  email: FormControl<string>;
  password: FormControl<string>;
}

/**
 * The sign-in page: e-mail and password, then, for people with one-time codes switched on,
 * the code step. The server's answers are shown inline.
 */
@Component({
  selector: 'tm-sign-in',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressSpinnerModule, ClinicalCaution, CodeStep, Wordmark, VisibilityToggle],
  templateUrl: './sign-in.html',
  styleUrl: './sign-in.scss',
})
export class SignIn {
  private readonly session = inject(AuthSession);
  private readonly router = inject(Router);
  private readonly destroyRef = inject(DestroyRef);

  /** Where to go after signing in (from the `returnUrl` query parameter). */
  readonly returnUrl = input<string>();

  protected readonly form = new FormGroup<SignInForm>({
    email: new FormControl('', { nonNullable: true, validators: zodValidator(loginSchema.shape.email) }),
    password: new FormControl('', { nonNullable: true, validators: zodValidator(loginSchema.shape.password) }),
  });

  protected readonly isSubmitting = signal(false);
  protected readonly isPasswordVisible = signal(false);
  /** The server's answer when sign-in failed. */
  protected readonly failure = signal<string | null>(null);
  protected readonly fieldMessage = fieldMessage;

  /** The password was right and a code is due (also after a reload half-way through). */
  protected readonly isAwaitingCode = this.session.isAwaitingCode;
  private readonly signInOptions = toSignal(this.session.signInOptions().pipe(catchError(() => of(null))), { initialValue: null });
  /** Demo mode: one-time codes are offered to everyone but required of no one. */
  protected readonly isSecondFactorOptional = computed(() => this.signInOptions()?.secondFactorPolicy === 'offered');


  protected signIn(): void {
    if (this.isSubmitting()) {
      return;
    }
    this.failure.set(null);
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.isSubmitting.set(true);
    this.session
      .signIn(this.form.getRawValue())
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (user) => {
          // With one-time codes on, the page now shows the code step instead of leaving.
          if (this.session.isAwaitingCode()) {
            this.isSubmitting.set(false);
            return;
          }
          void this.router.navigateByUrl(this.destinationFor(user));
        },
        error: (error: unknown) => {
          this.isSubmitting.set(false);
          this.showFailure(error);
        },
      });
  }

  protected finishSignIn(user: SessionUser): void {
    void this.router.navigateByUrl(this.destinationFor(user));
  }

  /** Leaves the half-finished sign-in on the server too, and shows the password step again. */
  protected startOver(): void {
    this.session
      .signOut()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe(() => this.form.controls.password.reset(''));
  }

  private showFailure(error: unknown): void {
    if (!(error instanceof HttpErrorResponse)) {
      this.failure.set('Signing in failed. Try again.');
      return;
    }
    const details = apiErrorDetails(error);
    if (error.status === 400 && details?.fields) {
      for (const [name, message] of Object.entries(details.fields)) {
        const control = name === 'email' || name === 'password' ? this.form.controls[name] : null;
        control?.setErrors({ ...control.errors, [SERVER_ERROR]: message });
        control?.markAsTouched();
      }
    }
    // 401 and 429 carry the sentence we want (one message for unknown user and wrong
    // password; when to retry); other statuses get our general wording.
    const isServerWordingBest = error.status === 400 || error.status === 401 || error.status === 429;
    this.failure.set(isServerWordingBest && details ? details.message : describeHttpError(error));
  }

  /**
   * Sign-in protection when the role must set up one-time codes first; otherwise the
   * `returnUrl` if it is a page of this app (never another site), else the role's home.
   */
  private destinationFor(user: SessionUser): string {
    if (this.session.secondFactor() === 'enrolment-required') {
      return ACCOUNT_SECURITY_PATH;
    }
    const requested = this.returnUrl();
    const isLocalPath = !!requested && requested.startsWith('/') && !requested.startsWith('//');
    return isLocalPath && !requested.startsWith(SIGN_IN_PATH) ? requested : homePathFor(user.role);
  }
}
