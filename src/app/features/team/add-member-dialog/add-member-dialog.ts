import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { PASSWORD_MIN_LENGTH, ROLES, ROLE_LABELS, type Role, type UserView, userCreateSchema } from '@tidemark/shared';
import { apiErrorDetails } from '../../../core/http/api-error-details';
import { describeHttpError } from '../../../core/http/describe-http-error';
import { SERVER_ERROR, fieldMessage, zodValidator } from '../../../shared/forms/zod-validator';
import { ROLE_SUMMARIES } from '../role-summaries';
import { TeamApi } from '../team-api';
import { VisibilityToggle } from '../../../shared/forms/visibility-toggle/visibility-toggle';

/** The add-member form's controls. */
interface AddMemberForm {
  displayName: FormControl<string>;
  email: FormControl<string>;
  role: FormControl<Role>;
  password: FormControl<string>;
}

/** Dialog that creates an account; closes with the new member, or undefined when cancelled. */
@Component({
  selector: 'tm-add-member-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatButtonModule, MatDialogModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule, VisibilityToggle],
  templateUrl: './add-member-dialog.html',
  styleUrl: './add-member-dialog.scss',
})
export class AddMemberDialog {
  private readonly teamApi = inject(TeamApi);
  private readonly dialogRef = inject<MatDialogRef<AddMemberDialog, UserView>>(MatDialogRef);
  private readonly destroyRef = inject(DestroyRef);

  protected readonly roles = ROLES;
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly passwordMinLength = PASSWORD_MIN_LENGTH;
  protected readonly fieldMessage = fieldMessage;

  protected readonly form = new FormGroup<AddMemberForm>({
    displayName: new FormControl('', {
      nonNullable: true,
      validators: zodValidator(userCreateSchema.shape.displayName),
    }),
    email: new FormControl('', { nonNullable: true, validators: zodValidator(userCreateSchema.shape.email) }),
    role: new FormControl<Role>('clinician', { nonNullable: true }),
    password: new FormControl('', { nonNullable: true, validators: zodValidator(userCreateSchema.shape.password) }),
  });

  private readonly chosenRole = toSignal(this.form.controls.role.valueChanges, {
    initialValue: this.form.controls.role.value,
  });
  protected readonly roleSummary = computed(() => ROLE_SUMMARIES[this.chosenRole()]);

  protected readonly isSaving = signal(false);
  protected readonly isPasswordVisible = signal(false);
  /** A failure that belongs to no single field. */
  protected readonly failure = signal<string | null>(null);


  protected addMember(): void {
    if (this.isSaving()) {
      return;
    }
    this.failure.set(null);
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.isSaving.set(true);
    this.teamApi
      .create(this.form.getRawValue())
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (member) => this.dialogRef.close(member),
        error: (error: unknown) => {
          this.isSaving.set(false);
          this.showFailure(error);
        },
      });
  }

  private showFailure(error: unknown): void {
    if (!(error instanceof HttpErrorResponse)) {
      this.failure.set('The team member could not be added. Try again.');
      return;
    }
    const details = apiErrorDetails(error);
    const fields = { ...details?.fields };
    // A taken address is a property of the e-mail field, so say it there.
    if (error.status === 409 && details) {
      fields['email'] = details.message;
    }
    let isShownOnField = false;
    for (const [name, message] of Object.entries(fields)) {
      if (this.isFormField(name)) {
        const control = this.form.controls[name];
        control.setErrors({ ...control.errors, [SERVER_ERROR]: message });
        control.markAsTouched();
        isShownOnField = true;
      }
    }
    if (!isShownOnField) {
      this.failure.set(error.status === 400 && details ? details.message : describeHttpError(error));
    }
  }

  private isFormField(name: string): name is keyof AddMemberForm {
    return name in this.form.controls;
  }
}
