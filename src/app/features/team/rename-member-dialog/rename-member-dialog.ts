import { ChangeDetectionStrategy, Component, DestroyRef, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { displayNameSchema, type UserView } from '@tidemark/shared';
import { fieldMessage, zodValidator } from '../../../shared/forms/zod-validator';
import { TeamApi } from '../team-api';
import { showServerFieldErrors } from '../../../shared/forms/server-field-errors';

/** The rename form's one control. */
interface RenameForm {
  displayName: FormControl<string>;
}

/** Changes the name a member is shown by; closes with the updated member, or undefined when cancelled or unchanged. */
@Component({
  selector: 'tm-rename-member-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatButtonModule, MatDialogModule, MatFormFieldModule, MatIconModule, MatInputModule],
  template: `
    <h2 mat-dialog-title>Rename {{ member.displayName }}</h2>
    <form [formGroup]="form" (ngSubmit)="saveName()" novalidate>
      <mat-dialog-content class="fields">
        <p class="intro">Tidemark shows the new name wherever it names this member. Their e-mail address, role and password stay as they are.</p>
        <mat-form-field appearance="outline" subscriptSizing="dynamic">
          <mat-label>Name</mat-label>
          <input matInput formControlName="displayName" autocomplete="off" cdkFocusInitial />
          <mat-hint>As colleagues should see it, e.g. with a title.</mat-hint>
          @if (fieldMessage(form.controls.displayName); as message) {
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
        <button mat-flat-button type="submit" [disabled]="isSaving()">Save name</button>
      </mat-dialog-actions>
    </form>
  `,
  styleUrl: '../member-dialog.scss',
})
export class RenameMemberDialog {
  private readonly teamApi = inject(TeamApi);
  private readonly dialogRef = inject<MatDialogRef<RenameMemberDialog, UserView>>(MatDialogRef);
  private readonly destroyRef = inject(DestroyRef);

  /** Whom the dialog renames. */
  protected readonly member = inject<UserView>(MAT_DIALOG_DATA);
  protected readonly fieldMessage = fieldMessage;

  protected readonly form = new FormGroup<RenameForm>({
    displayName: new FormControl(this.member.displayName, { nonNullable: true, validators: zodValidator(displayNameSchema) }),
  });

  protected readonly isSaving = signal(false);
  /** A failure that belongs to no field. */
  protected readonly failure = signal<string | null>(null);

  protected saveName(): void {
    if (this.isSaving()) return;
    this.failure.set(null);
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const displayName = this.form.controls.displayName.value.trim();
    // Nothing changed: nothing to save, and no change-history noise.
    if (displayName === this.member.displayName) {
      this.dialogRef.close();
      return;
    }
    this.isSaving.set(true);
    this.teamApi
      .rename(this.member.id, displayName)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (updated) => this.dialogRef.close(updated),
        error: (error: unknown) => {
          this.isSaving.set(false);
          this.failure.set(showServerFieldErrors(error, this.form, 'The name could not be saved. Try again.'));
        },
      });
  }

}
