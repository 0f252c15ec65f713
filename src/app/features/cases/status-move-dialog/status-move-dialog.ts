import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, DestroyRef, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { CASE_STATUS_LABELS, changeReason, type CaseDetail, type CaseStatus, type CaseUpdateRequest } from '@tidemark/shared';
import { apiErrorDetails } from '../../../core/http/api-error-details';
import { describeHttpError } from '../../../core/http/describe-http-error';
import { SERVER_ERROR, fieldMessage, zodValidator } from '../../../shared/forms/zod-validator';
import { CasesApi } from '../cases-api';

/** The move being asked for. */
export interface StatusMove {
  readonly caseId: number;
  readonly patientCode: string;
  /** The version the person saw; a newer one on the server answers 409. */
  readonly version: number;
  readonly from: CaseStatus;
  readonly to: CaseStatus;
  /** The case's suture size, sent back unchanged (see `saveMove`). */
  readonly sutureSize: string | null;
}

/** How the dialog ends: the updated case, a request to reload (someone else changed it), or nothing. */
export type StatusMoveResult = CaseDetail | 'reload' | undefined;

/** Button words per target state, shared with the case page's action buttons. */
export const STATUS_MOVE_ACTIONS: Readonly<Record<CaseStatus, { label: string; icon: string }>> = {
  planned: { label: 'Back to planned', icon: 'edit_calendar' },
  operated: { label: 'Record as operated', icon: 'healing' },
  'in-recall': { label: 'Start recalls', icon: 'event_repeat' },
  concluded: { label: 'Conclude case', icon: 'task_alt' },
  withdrawn: { label: 'Withdraw case', icon: 'block' },
};

/** Asks why a case moves to another state, then saves the move with the version it was read at. */
@Component({
  selector: 'tm-status-move-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatDialogModule, MatFormFieldModule, MatIconModule, MatInputModule, ReactiveFormsModule],
  templateUrl: './status-move-dialog.html',
  styles: `
    .fields {
      display: flex;
      flex-direction: column;
      gap: 12px;
      min-width: min(480px, 80vw);
    }
    p {
      margin: 0;
      max-width: 52ch;
    }
    mat-form-field {
      width: 100%;
    }
    .failure {
      display: flex;
      gap: 8px;
      color: var(--mat-sys-error);
    }
    mat-dialog-actions {
      padding: 8px 24px 20px;
      gap: 8px;
    }
  `,
})
export class StatusMoveDialog {
  private readonly api = inject(CasesApi);
  private readonly dialogRef = inject<MatDialogRef<StatusMoveDialog, StatusMoveResult>>(MatDialogRef);
  private readonly destroyRef = inject(DestroyRef);
  protected readonly move = inject<StatusMove>(MAT_DIALOG_DATA);

  protected readonly isWithdrawal = this.move.to === 'withdrawn';
  protected readonly action = STATUS_MOVE_ACTIONS[this.move.to].label;
  protected readonly fromLabel = CASE_STATUS_LABELS[this.move.from];
  protected readonly toLabel = CASE_STATUS_LABELS[this.move.to];
  protected readonly fieldMessage = fieldMessage;
  protected readonly form = new FormGroup({
    reason: new FormControl('', { nonNullable: true, validators: zodValidator(changeReason) }),
  });
  protected readonly reason = this.form.controls.reason;

  protected readonly isSaving = signal(false);
  protected readonly failure = signal<string | null>(null);
  /** Set when someone else changed the case first: the only way on is to reload it. */
  protected readonly isStale = signal(false);

  protected saveMove(): void {
    if (this.isSaving()) {
      return;
    }
    this.failure.set(null);
    if (this.reason.invalid) {
      this.reason.markAsTouched();
      return;
    }
    const reason = this.reason.value.trim();
    const change: CaseUpdateRequest = {
      version: this.move.version,
      reason,
      status: this.move.to,
      // One sentence serves both: the change log's reason and the case's withdrawal note.
      ...(this.isWithdrawal ? { withdrawnReason: reason } : {}),
      // The shared update schema defaults a missing sutureSize to null, so a PATCH without it
      // would erase the recorded size. Sending the current value keeps it (and logs no change).
      ...(this.move.sutureSize !== null ? { sutureSize: this.move.sutureSize } : {}),
    };
    this.isSaving.set(true);
    this.api
      .update(this.move.caseId, change)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (updated) => this.dialogRef.close(updated),
        error: (error: unknown) => {
          this.isSaving.set(false);
          this.showFailure(error);
        },
      });
  }

  protected reloadCase(): void {
    this.dialogRef.close('reload');
  }

  private showFailure(error: unknown): void {
    if (!(error instanceof HttpErrorResponse)) {
      this.failure.set('The status could not be changed. Try again.');
      return;
    }
    const details = apiErrorDetails(error);
    if (error.status === 409) {
      this.isStale.set(true);
      this.failure.set(details?.message ?? describeHttpError(error));
      return;
    }
    const fields = details?.fields ?? {};
    const reasonMessage = fields['reason'] ?? fields['withdrawnReason'];
    if (reasonMessage) {
      this.reason.setErrors({ ...this.reason.errors, [SERVER_ERROR]: reasonMessage });
      this.reason.markAsTouched();
    }
    // Other fields (e.g. a future surgery date for "operated") are not on this form: say them here.
    const others = Object.entries(fields)
      .filter(([name]) => name !== 'reason' && name !== 'withdrawnReason')
      .map(([, message]) => message);
    if (others.length > 0 || !reasonMessage) {
      this.failure.set([details?.message ?? describeHttpError(error), ...others].join(' '));
    }
  }
}
