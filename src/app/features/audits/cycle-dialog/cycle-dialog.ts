import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, DestroyRef, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { cycleCreateSchema, isoDate, type CycleView } from '@tidemark/shared';
import { apiErrorDetails } from '../../../core/http/api-error-details';
import { describeHttpError } from '../../../core/http/describe-http-error';
import { requiredZodValidator } from '../../../shared/forms/required-zod-validator';
import { SCHEMA_ERROR, SERVER_ERROR, fieldMessage, zodValidator } from '../../../shared/forms/zod-validator';
import { AuditsApi } from '../audits-api';
import { issueMessages, placeFieldMessages, revalidate } from '../field-messages';
import { unlessEmpty } from '../scope/audit-form';

/** A new cycle of an audit (with suggested dates), or an existing cycle to change. */
export interface CycleDialogData {
  readonly auditId: number;
  readonly cycle?: CycleView;
  /** Suggested period for a new cycle. */
  readonly suggestedStart?: string;
  readonly suggestedEnd?: string;
}

const fields = cycleCreateSchema.shape;

/** Opens a cycle over a period of surgery dates, or changes its dates, presentation date and notes. */
@Component({
  selector: 'tm-cycle-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatDialogModule, MatFormFieldModule, MatIconModule, MatInputModule, ReactiveFormsModule],
  template: `
    <h2 mat-dialog-title>{{ cycle ? 'Cycle ' + cycle.number : 'New cycle' }}</h2>
    <form [formGroup]="form" (ngSubmit)="saveCycle()" novalidate>
      <mat-dialog-content class="fields">
        <p class="hint">
          @if (isFrozen) {
            The results of this cycle are frozen, so its period stays as reported.
          } @else {
            The cycle measures cases operated within its period.
          }
        </p>
        <div class="pair">
          <mat-form-field appearance="outline" subscriptSizing="dynamic">
            <mat-label>Period starts</mat-label>
            <input matInput type="date" formControlName="periodStart" />
            @if (fieldMessage(form.controls.periodStart); as message) {
              <mat-error>{{ message }}</mat-error>
            }
          </mat-form-field>
          <mat-form-field appearance="outline" subscriptSizing="dynamic">
            <mat-label>Period ends</mat-label>
            <input matInput type="date" formControlName="periodEnd" />
            @if (fieldMessage(form.controls.periodEnd); as message) {
              <mat-error>{{ message }}</mat-error>
            }
          </mat-form-field>
        </div>
        @if (cycle) {
          <mat-form-field appearance="outline" subscriptSizing="dynamic">
            <mat-label>Presented to the team on</mat-label>
            <input matInput type="date" formControlName="presentedDate" />
            @if (fieldMessage(form.controls.presentedDate); as message) {
              <mat-error>{{ message }}</mat-error>
            }
          </mat-form-field>
        }
        <mat-form-field appearance="outline" subscriptSizing="dynamic">
          <mat-label>Notes</mat-label>
          <textarea matInput formControlName="notes" rows="3"></textarea>
          @if (fieldMessage(form.controls.notes); as message) {
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
        <button mat-flat-button type="submit" [disabled]="isSaving()">{{ cycle ? 'Save cycle' : 'Open cycle' }}</button>
      </mat-dialog-actions>
    </form>
  `,
  styleUrl: '../audit-dialog-form.scss',
  styles: `
    .hint {
      margin: 0;
      color: var(--mat-sys-on-surface-variant);
    }
  `,
})
export class CycleDialog {
  private readonly api = inject(AuditsApi);
  private readonly dialogRef = inject<MatDialogRef<CycleDialog, CycleView>>(MatDialogRef);
  private readonly destroyRef = inject(DestroyRef);
  private readonly data = inject<CycleDialogData>(MAT_DIALOG_DATA);

  protected readonly cycle = this.data.cycle;
  protected readonly isFrozen = !!this.cycle?.frozenAt;
  protected readonly fieldMessage = fieldMessage;
  protected readonly form = new FormGroup({
    periodStart: new FormControl(
      { value: this.cycle?.periodStart ?? this.data.suggestedStart ?? '', disabled: this.isFrozen },
      { nonNullable: true, validators: requiredZodValidator(fields.periodStart, 'Enter the first surgery date of the period.') },
    ),
    periodEnd: new FormControl(
      { value: this.cycle?.periodEnd ?? this.data.suggestedEnd ?? '', disabled: this.isFrozen },
      { nonNullable: true, validators: requiredZodValidator(fields.periodEnd, 'Enter the last surgery date of the period.') },
    ),
    presentedDate: new FormControl(this.cycle?.presentedDate ?? '', { nonNullable: true, validators: unlessEmpty(zodValidator(isoDate)) }),
    notes: new FormControl(this.cycle?.notes ?? '', { nonNullable: true, validators: zodValidator(fields.notes) }),
  });
  protected readonly isSaving = signal(false);
  protected readonly failure = signal<string | null>(null);

  protected saveCycle(): void {
    if (this.isSaving()) return;
    this.failure.set(null);
    revalidate(this.form);
    const value = this.form.getRawValue();
    const parsed = cycleCreateSchema.safeParse({ periodStart: value.periodStart, periodEnd: value.periodEnd, notes: value.notes });
    if (!parsed.success) placeFieldMessages(this.form, issueMessages(parsed.error.issues), SCHEMA_ERROR);
    if (this.form.invalid || !parsed.success) {
      this.form.markAllAsTouched();
      return;
    }
    this.isSaving.set(true);
    const cycle = this.cycle;
    const call = cycle
      ? this.api.updateCycle(cycle.id, {
          ...(this.isFrozen ? {} : { periodStart: value.periodStart, periodEnd: value.periodEnd }),
          presentedDate: value.presentedDate || null,
          notes: value.notes,
          version: cycle.version,
        })
      : this.api.addCycle(this.data.auditId, parsed.data);
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
      this.failure.set('The cycle could not be saved. Try again.');
      return;
    }
    if (error.status === 409) {
      this.failure.set(apiErrorDetails(error)?.message ?? 'Someone else changed this cycle. Close the dialog and reload the audit.');
      return;
    }
    const details = apiErrorDetails(error);
    const unplaced = placeFieldMessages(this.form, details?.fields ?? {}, SERVER_ERROR);
    if (!details?.fields || unplaced.length > 0) {
      this.failure.set([details && error.status < 500 ? details.message : describeHttpError(error), ...unplaced].join(' '));
    }
  }
}
