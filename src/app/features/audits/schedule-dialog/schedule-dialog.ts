import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, DestroyRef, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormArray, FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { recallIntervalSchema, scheduleCreateSchema, type RecallInterval, type ScheduleCreateRequest, type ScheduleView } from '@tidemark/shared';
import { apiErrorDetails } from '../../../core/http/api-error-details';
import { describeHttpError } from '../../../core/http/describe-http-error';
import { requiredZodValidator } from '../../../shared/forms/required-zod-validator';
import { SCHEMA_ERROR, SERVER_ERROR, fieldMessage, zodValidator } from '../../../shared/forms/zod-validator';
import { AuditsApi } from '../audits-api';
import { issueMessages, placeFieldMessages, revalidate } from '../field-messages';

/** What the dialog starts from: the practice schedule, whose intervals recalls are entered against. */
export interface ScheduleDialogData {
  readonly practice: ScheduleView;
}

/** One interval of the practice schedule: audited or not, and its tolerance window. */
interface IntervalChoiceForm {
  isAudited: FormControl<boolean>;
  windowBeforeDays: FormControl<number | null>;
  windowAfterDays: FormControl<number | null>;
}

interface ScheduleForm {
  name: FormControl<string>;
  intervals: FormArray<FormGroup<IntervalChoiceForm>>;
}

const intervalFields = recallIntervalSchema.shape;

/**
 * Defines a recall schedule for audits: which of the practice's recall intervals to audit and how
 * wide each window is (days before and after the target day). Intervals are the practice's own,
 * because recalls are entered against them; a schedule of other intervals would find no visits.
 */
@Component({
  selector: 'tm-schedule-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatCheckboxModule, MatDialogModule, MatFormFieldModule, MatIconModule, MatInputModule, ReactiveFormsModule],
  templateUrl: './schedule-dialog.html',
  styleUrl: './schedule-dialog.scss',
})
export class ScheduleDialog {
  private readonly api = inject(AuditsApi);
  private readonly dialogRef = inject<MatDialogRef<ScheduleDialog, ScheduleView>>(MatDialogRef);
  private readonly destroyRef = inject(DestroyRef);
  protected readonly data = inject<ScheduleDialogData>(MAT_DIALOG_DATA);

  protected readonly fieldMessage = fieldMessage;
  protected readonly form = new FormGroup<ScheduleForm>({
    name: new FormControl('', { nonNullable: true, validators: zodValidator(scheduleCreateSchema.shape.name) }),
    intervals: new FormArray(
      this.data.practice.intervals.map(
        (interval) =>
          new FormGroup<IntervalChoiceForm>({
            isAudited: new FormControl(true, { nonNullable: true }),
            windowBeforeDays: new FormControl(interval.windowBeforeDays, { validators: requiredZodValidator(intervalFields.windowBeforeDays, 'Enter the days before.') }),
            windowAfterDays: new FormControl(interval.windowAfterDays, { validators: requiredZodValidator(intervalFields.windowAfterDays, 'Enter the days after.') }),
          }),
      ),
    ),
  });

  protected readonly isSaving = signal(false);
  protected readonly failure = signal<string | null>(null);

  constructor() {
    // An interval left out needs no window: its fields rest, and cannot block saving.
    for (const row of this.form.controls.intervals.controls) {
      row.controls.isAudited.valueChanges.pipe(takeUntilDestroyed()).subscribe((isAudited) => {
        for (const window of [row.controls.windowBeforeDays, row.controls.windowAfterDays]) {
          if (isAudited) window.enable();
          else window.disable();
        }
      });
    }
  }

  protected saveSchedule(): void {
    if (this.isSaving()) return;
    this.failure.set(null);
    revalidate(this.form);
    const request = scheduleRequest(this.data.practice.intervals, this.form);
    const parsed = scheduleCreateSchema.safeParse(request);
    const unplaced = parsed.success ? [] : placeFieldMessages(this.form, issueMessages(parsed.error.issues), SCHEMA_ERROR);
    if (this.form.invalid || !parsed.success) {
      this.form.markAllAsTouched();
      // "Add at least one interval." has no field of its own here: said in the dialog's words.
      this.failure.set(request.intervals.length === 0 ? 'Tick at least one interval to audit.' : unplaced.join(' ') || null);
      return;
    }
    this.isSaving.set(true);
    this.api
      .createSchedule(request)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (saved) => this.dialogRef.close(saved),
        error: (error: unknown) => {
          this.isSaving.set(false);
          this.showFailure(error);
        },
      });
  }

  private showFailure(error: unknown): void {
    if (!(error instanceof HttpErrorResponse)) {
      this.failure.set('The schedule could not be saved. Try again.');
      return;
    }
    const details = apiErrorDetails(error);
    const unplaced = placeFieldMessages(this.form, details?.fields ?? {}, SERVER_ERROR);
    if (!details?.fields || unplaced.length > 0) {
      this.failure.set([details && error.status < 500 ? details.message : describeHttpError(error), ...unplaced].join(' '));
    }
  }
}

/**
 * The schedule as the API takes it: the ticked practice intervals, in the practice's order, with
 * their keys, labels and target days unchanged and the windows as typed.
 */
export function scheduleRequest(practice: readonly RecallInterval[], form: FormGroup<ScheduleForm>): ScheduleCreateRequest {
  const value = form.getRawValue();
  const intervals = practice.flatMap((interval, index) => {
    const choice = value.intervals[index];
    if (!choice?.isAudited) return [];
    return [{ ...interval, windowBeforeDays: choice.windowBeforeDays ?? Number.NaN, windowAfterDays: choice.windowAfterDays ?? Number.NaN }];
  });
  return { name: value.name.trim(), intervals };
}
