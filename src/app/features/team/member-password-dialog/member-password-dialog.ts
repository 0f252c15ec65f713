import { ChangeDetectionStrategy, Component, DestroyRef, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { PASSWORD_MIN_LENGTH, passwordSchema, type UserView } from '@tidemark/shared';
import { matchesPassword, recheckRepeatOnChange, requireRepeat } from '../../../shared/forms/matching-password';
import { fieldMessage, zodValidator } from '../../../shared/forms/zod-validator';
import { TeamApi } from '../team-api';
import { VisibilityToggle } from '../../../shared/forms/visibility-toggle/visibility-toggle';
import { PasswordRules } from '../../../shared/forms/password-rules/password-rules';
import { showServerFieldErrors } from '../../../shared/forms/server-field-errors';

/** The new-password form's controls. */
interface PasswordForm {
  password: FormControl<string>;
  repeat: FormControl<string>;
}

/**
 * Sets a new password for a member (forgotten password, or one that may have leaked). Closes
 * with the member once saved, or undefined when cancelled. The rules are those of
 * `shared/schemas/user.ts` and the server's common-password check (server/auth/common-passwords.ts).
 */
@Component({
  selector: 'tm-member-password-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatButtonModule, MatDialogModule, MatFormFieldModule, MatIconModule, MatInputModule, VisibilityToggle, PasswordRules],
  template: `
    <h2 mat-dialog-title>New password for {{ member.displayName }}</h2>
    <form [formGroup]="form" (ngSubmit)="savePassword()" novalidate>
      <mat-dialog-content class="fields">
        <p class="intro">
          Saving signs {{ member.displayName }} out on every device. Give them the new password privately, in person or by phone.
        </p>
        <tm-password-rules id="password-rules" />
        <mat-form-field appearance="outline" subscriptSizing="dynamic">
          <mat-label>New password</mat-label>
          <input
            matInput
            formControlName="password"
            [type]="isPasswordVisible() ? 'text' : 'password'"
            autocomplete="new-password"
            aria-describedby="password-rules"
            cdkFocusInitial
          />
          <tm-visibility-toggle matSuffix [(shown)]="isPasswordVisible" />
          <mat-hint>At least {{ minLength }} characters.</mat-hint>
          @if (fieldMessage(form.controls.password); as message) {
            <mat-error>{{ message }}</mat-error>
          }
        </mat-form-field>
        <mat-form-field appearance="outline" subscriptSizing="dynamic">
          <mat-label>Type it again</mat-label>
          <input matInput formControlName="repeat" [type]="isPasswordVisible() ? 'text' : 'password'" autocomplete="new-password" />
          @if (fieldMessage(form.controls.repeat); as message) {
            <mat-error>{{ message }}</mat-error>
          }
        </mat-form-field>
        <div class="failure" role="alert">
          @if (failure(); as message) {
            <mat-icon aria-hidden="true">error</mat-icon>
            <span>{{ message }}</span>
          }
        </div>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="isSaving()">Set password</button>
      </mat-dialog-actions>
    </form>
  `,
  styleUrl: '../member-dialog.scss',
})
export class MemberPasswordDialog {
  private readonly teamApi = inject(TeamApi);
  private readonly dialogRef = inject<MatDialogRef<MemberPasswordDialog, UserView>>(MatDialogRef);
  private readonly destroyRef = inject(DestroyRef);

  /** Whose password is set. */
  protected readonly member = inject<UserView>(MAT_DIALOG_DATA);
  protected readonly minLength = PASSWORD_MIN_LENGTH;
  protected readonly fieldMessage = fieldMessage;

  protected readonly form = new FormGroup<PasswordForm>({
    password: new FormControl('', { nonNullable: true, validators: zodValidator(passwordSchema) }),
    repeat: new FormControl('', { nonNullable: true, validators: matchesPassword('password') }),
  });

  protected readonly isSaving = signal(false);
  protected readonly isPasswordVisible = signal(false);
  /** A failure that belongs to no field. */
  protected readonly failure = signal<string | null>(null);

  constructor() {
    recheckRepeatOnChange(this.form.controls.password, this.form.controls.repeat);
  }

  protected savePassword(): void {
    if (this.isSaving()) return;
    this.failure.set(null);
    const { repeat } = this.form.controls;
    requireRepeat(repeat);
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.isSaving.set(true);
    this.teamApi
      .setPassword(this.member.id, this.form.controls.password.value)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (updated) => this.dialogRef.close(updated),
        error: (error: unknown) => {
          this.isSaving.set(false);
          this.failure.set(showServerFieldErrors(error, this.form, 'The password could not be saved. Try again.'));
        },
      });
  }

}
