import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, DestroyRef, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { ACTION_STATES, ACTION_STATE_LABELS, actionItemCreateSchema, type ActionItemView, type ActionState, type OperatorView } from '@tidemark/shared';
import { apiErrorDetails } from '../../../core/http/api-error-details';
import { describeHttpError } from '../../../core/http/describe-http-error';
import { requiredZodValidator } from '../../../shared/forms/required-zod-validator';
import { SERVER_ERROR, fieldMessage, zodValidator } from '../../../shared/forms/zod-validator';
import { AuditsApi } from '../audits-api';
import { placeFieldMessages } from '../field-messages';

/** A new action of a cycle's plan, or an existing one to change. */
export interface ActionDialogData {
  readonly cycleId: number;
  readonly owners: readonly OperatorView[];
  readonly action?: ActionItemView;
}

const fields = actionItemCreateSchema.shape;

/** One action of the improvement plan: what, who owns it, by when, and how far it has got. */
@Component({
  selector: 'tm-action-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatDialogModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule, ReactiveFormsModule],
  template: `
    <h2 mat-dialog-title>{{ existing ? 'Change action' : 'Add an action' }}</h2>
    <form [formGroup]="form" (ngSubmit)="saveAction()" novalidate>
      <mat-dialog-content class="fields">
        <mat-form-field appearance="outline" subscriptSizing="dynamic">
          <mat-label>Action</mat-label>
          <textarea matInput formControlName="action" rows="2" cdkFocusInitial></textarea>
          <mat-hint>What will change, so the re-audit can show whether it worked.</mat-hint>
          @if (fieldMessage(form.controls.action); as message) {
            <mat-error>{{ message }}</mat-error>
          }
        </mat-form-field>
        <mat-form-field appearance="outline" subscriptSizing="dynamic">
          <mat-label>Owner</mat-label>
          <mat-select formControlName="ownerId">
            @for (owner of data.owners; track owner.id) {
              <mat-option [value]="owner.id">{{ owner.displayName }}</mat-option>
            }
          </mat-select>
          @if (fieldMessage(form.controls.ownerId); as message) {
            <mat-error>{{ message }}</mat-error>
          }
        </mat-form-field>
        <div class="pair">
          <mat-form-field appearance="outline" subscriptSizing="dynamic">
            <mat-label>Due by</mat-label>
            <input matInput type="date" formControlName="dueDate" />
            @if (fieldMessage(form.controls.dueDate); as message) {
              <mat-error>{{ message }}</mat-error>
            }
          </mat-form-field>
          <mat-form-field appearance="outline" subscriptSizing="dynamic">
            <mat-label>State</mat-label>
            <mat-select formControlName="state">
              @for (state of states; track state) {
                <mat-option [value]="state">{{ stateLabels[state] }}</mat-option>
              }
            </mat-select>
          </mat-form-field>
        </div>
        <div class="failure" role="alert">
          @if (failure(); as message) {
            <mat-icon aria-hidden="true">error</mat-icon>
            <span>{{ message }}</span>
          }
        </div>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="isSaving()">{{ existing ? 'Save action' : 'Add action' }}</button>
      </mat-dialog-actions>
    </form>
  `,
  styleUrl: '../audit-dialog-form.scss',
})
export class ActionDialog {
  private readonly api = inject(AuditsApi);
  private readonly dialogRef = inject<MatDialogRef<ActionDialog, ActionItemView>>(MatDialogRef);
  private readonly destroyRef = inject(DestroyRef);
  protected readonly data = inject<ActionDialogData>(MAT_DIALOG_DATA);

  protected readonly existing = this.data.action;
  protected readonly states = ACTION_STATES;
  protected readonly stateLabels = ACTION_STATE_LABELS;
  protected readonly fieldMessage = fieldMessage;
  protected readonly form = new FormGroup({
    action: new FormControl(this.existing?.action ?? '', { nonNullable: true, validators: zodValidator(fields.action) }),
    ownerId: new FormControl<number | null>(this.existing?.owner.id ?? null, { validators: requiredZodValidator(fields.ownerId, 'Choose who owns it.') }),
    dueDate: new FormControl(this.existing?.dueDate ?? '', { nonNullable: true, validators: requiredZodValidator(fields.dueDate, 'Enter the date it is due.') }),
    state: new FormControl<ActionState>(this.existing?.state ?? 'open', { nonNullable: true }),
  });
  protected readonly isSaving = signal(false);
  protected readonly failure = signal<string | null>(null);

  protected saveAction(): void {
    if (this.isSaving()) return;
    this.failure.set(null);
    const value = this.form.getRawValue();
    if (this.form.invalid || value.ownerId === null) {
      this.form.markAllAsTouched();
      return;
    }
    const action = { action: value.action.trim(), ownerId: value.ownerId, dueDate: value.dueDate, state: value.state };
    this.isSaving.set(true);
    const existing = this.existing;
    const call = existing ? this.api.updateAction(existing.id, { ...action, version: existing.version }) : this.api.addAction(this.data.cycleId, action);
    call.pipe(takeUntilDestroyed(this.destroyRef)).subscribe({
      next: (saved) => this.dialogRef.close(saved),
      error: (error: unknown) => {
        this.isSaving.set(false);
        this.showFailure(error);
      },
    });
  }

  private showFailure(error: unknown): void {
    if (!(error instanceof HttpErrorResponse)) {
      this.failure.set('The action could not be saved. Try again.');
      return;
    }
    const details = apiErrorDetails(error);
    if (error.status === 409) {
      this.failure.set(details?.message ?? 'Someone else changed this action. Close the dialog and reload the audit.');
      return;
    }
    const unplaced = placeFieldMessages(this.form, details?.fields ?? {}, SERVER_ERROR);
    if (!details?.fields || unplaced.length > 0) {
      this.failure.set([details && error.status < 500 ? details.message : describeHttpError(error), ...unplaced].join(' '));
    }
  }
}
