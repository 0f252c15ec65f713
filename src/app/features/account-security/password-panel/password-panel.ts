import { ChangeDetectionStrategy, Component, DestroyRef, inject, output, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule, type FormGroupDirective } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { PASSWORD_MIN_LENGTH, SAME_PASSWORD_MESSAGE, passwordChangeSchema, passwordSchema, type PasswordChangeResult } from '@tidemark/shared';
import { matchesPassword, recheckRepeatOnChange, requireRepeat } from '../../../shared/forms/matching-password';
import { SCHEMA_ERROR, fieldMessage, zodValidator } from '../../../shared/forms/zod-validator';
import { AccountSecurityApi } from '../account-security-api';
import { VisibilityToggle } from '../../../shared/forms/visibility-toggle/visibility-toggle';
import { PasswordRules } from '../../../shared/forms/password-rules/password-rules';
import { showServerFieldErrors } from '../../../shared/forms/server-field-errors';

/** The own-password form's controls. */
interface OwnPasswordForm {
  currentPassword: FormControl<string>;
  newPassword: FormControl<string>;
  repeat: FormControl<string>;
}

/** What the panel says once the server has taken the new password. */
export function passwordChangedSentence(result: PasswordChangeResult): string {
  const ended =
    result.endedSessions === 0
      ? 'You had no other open sessions.'
      : result.endedSessions === 1
        ? 'Your other open session was signed out.'
        : `Your ${result.endedSessions} other open sessions were signed out.`;
  return `Password changed. ${ended} A confirmation went to your e-mail address.`;
}

/**
 * The signed-in person changes their own password: the current one, then the new one twice.
 * The rules are `passwordChangeSchema` in shared/schemas/user.ts plus the server's
 * common-password check; the server's field errors show under their fields.
 */
@Component({
  selector: 'tm-password-panel',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, VisibilityToggle, PasswordRules],
  templateUrl: './password-panel.html',
  styleUrls: ['../account-panel.scss', './password-panel.scss'],
})
export class PasswordPanel {
  private readonly api = inject(AccountSecurityApi);
  private readonly destroyRef = inject(DestroyRef);

  protected readonly minLength = PASSWORD_MIN_LENGTH;
  protected readonly fieldMessage = fieldMessage;

  protected readonly form = new FormGroup<OwnPasswordForm>({
    currentPassword: new FormControl('', { nonNullable: true, validators: zodValidator(passwordChangeSchema.shape.currentPassword) }),
    newPassword: new FormControl('', { nonNullable: true, validators: zodValidator(passwordSchema) }),
    repeat: new FormControl('', { nonNullable: true, validators: matchesPassword('newPassword') }),
  });

  protected readonly isSaving = signal(false);
  protected readonly isPasswordVisible = signal(false);
  /** A failure that belongs to no field. */
  protected readonly failure = signal<string | null>(null);
  protected readonly outcome = signal<string | null>(null);
  /** The server took the new password (and ended the person's other sessions). */
  readonly changed = output<PasswordChangeResult>();

  constructor() {
    recheckRepeatOnChange(this.form.controls.newPassword, this.form.controls.repeat);
  }

  protected changePassword(formDirective: FormGroupDirective): void {
    if (this.isSaving()) return;
    this.failure.set(null);
    this.outcome.set(null);
    const { currentPassword, newPassword, repeat } = this.form.controls;
    requireRepeat(repeat);
    if (newPassword.value !== '' && newPassword.value === currentPassword.value) {
      newPassword.setErrors({ [SCHEMA_ERROR]: SAME_PASSWORD_MESSAGE });
    }
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.isSaving.set(true);
    this.api
      .changePassword({ currentPassword: currentPassword.value, newPassword: newPassword.value })
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (result) => {
          this.isSaving.set(false);
          // Cleared without "required" errors showing: the form starts over, untouched.
          formDirective.resetForm();
          this.isPasswordVisible.set(false);
          this.outcome.set(passwordChangedSentence(result));
          this.changed.emit(result);
        },
        error: (error: unknown) => {
          this.isSaving.set(false);
          this.failure.set(showServerFieldErrors(error, this.form, 'The password could not be changed. Try again.'));
        },
      });
  }

}
