import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, output, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { oneTimeCodeSchema, recoveryCodeSchema, type SessionUser } from '@tidemark/shared';
import { SERVER_ERROR, fieldMessage, zodValidator } from '../../../shared/forms/zod-validator';
import { apiErrorDetails } from '../../http/api-error-details';
import { describeHttpError } from '../../http/describe-http-error';
import { AuthSession } from '../auth-session';

/** The code step's one control. */
interface CodeForm {
  code: FormControl<string>;
}

/**
 * The second sign-in step: a one-time code from the person's authenticator app, or one of
 * their recovery codes. Emits the person once the server has accepted the code.
 */
@Component({
  selector: 'tm-code-step',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressSpinnerModule,
    MatSlideToggleModule,
  ],
  templateUrl: './code-step.html',
  styleUrl: './code-step.scss',
})
export class CodeStep {
  private readonly session = inject(AuthSession);
  private readonly destroyRef = inject(DestroyRef);

  /** The server accepted the code; the session is fully signed in. */
  readonly verified = output<SessionUser>();
  /** The person chose to start again with the password. */
  readonly restarted = output<void>();

  protected readonly form = new FormGroup<CodeForm>({
    code: new FormControl('', { nonNullable: true, validators: zodValidator(oneTimeCodeSchema) }),
  });
  protected readonly isUsingRecoveryCode = signal(false);
  protected readonly isSubmitting = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly fieldMessage = fieldMessage;
  protected readonly codeLabel = computed(() => (this.isUsingRecoveryCode() ? 'Recovery code' : 'One-time code'));

  protected switchCodeKind(isRecovery: boolean): void {
    this.isUsingRecoveryCode.set(isRecovery);
    const control = this.form.controls.code;
    control.setValidators(zodValidator(isRecovery ? recoveryCodeSchema : oneTimeCodeSchema));
    control.reset('');
    this.failure.set(null);
  }

  protected verify(): void {
    if (this.isSubmitting()) {
      return;
    }
    this.failure.set(null);
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.isSubmitting.set(true);
    const code = this.form.controls.code.value;
    const request = this.isUsingRecoveryCode()
      ? { method: 'recovery-code' as const, code }
      : { method: 'one-time-code' as const, code };
    this.session
      .verifySecondFactor(request)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (user) => this.verified.emit(user),
        error: (error: unknown) => {
          this.isSubmitting.set(false);
          this.showFailure(error);
        },
      });
  }

  protected startOver(): void {
    this.restarted.emit();
  }

  private showFailure(error: unknown): void {
    if (!(error instanceof HttpErrorResponse)) {
      this.failure.set('The code could not be checked. Try again.');
      return;
    }
    const details = apiErrorDetails(error);
    const fieldText = details?.fields?.['code'];
    if (fieldText) {
      const control = this.form.controls.code;
      control.setErrors({ ...control.errors, [SERVER_ERROR]: fieldText });
      control.markAsTouched();
      return;
    }
    // 401 (the half-finished sign-in ran out) and 429 carry the sentence to show.
    const isServerWordingBest = error.status === 401 || error.status === 429 || error.status === 409;
    this.failure.set(isServerWordingBest && details ? details.message : describeHttpError(error));
  }
}
