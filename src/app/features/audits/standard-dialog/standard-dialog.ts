import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import {
  CLAVIEN_DINDO_GRADES,
  CLAVIEN_DINDO_LABELS,
  STANDARD_METRICS,
  STANDARD_METRIC_INFO,
  standardCreateSchema,
  type ClavienDindoGrade,
  type RecallInterval,
  type StandardCreateRequest,
  type StandardMetric,
  type StandardView,
} from '@tidemark/shared';
import { startWith } from 'rxjs';
import { apiErrorDetails } from '../../../core/http/api-error-details';
import { describeHttpError } from '../../../core/http/describe-http-error';
import { requiredZodValidator } from '../../../shared/forms/required-zod-validator';
import { SCHEMA_ERROR, SERVER_ERROR, fieldMessage, zodValidator } from '../../../shared/forms/zod-validator';
import { AuditsApi } from '../audits-api';
import { issueMessages, placeFieldMessages, revalidate } from '../field-messages';

/** What the dialog works on: a new standard of an audit, or an existing one to change. */
export interface StandardDialogData {
  readonly auditId: number;
  /** The audit's recall intervals, for measures taken at an interval. */
  readonly intervals: readonly RecallInterval[];
  readonly standard?: StandardView;
}

/** The standard form's controls. */
interface StandardForm {
  criterion: FormControl<string>;
  metric: FormControl<StandardMetric | null>;
  intervalKey: FormControl<string | null>;
  thresholdMm: FormControl<number | null>;
  thresholdPct: FormControl<number | null>;
  minGrade: FormControl<ClavienDindoGrade | null>;
  comparator: FormControl<'>=' | '<='>;
  target: FormControl<number | null>;
  evidenceSource: FormControl<string>;
  exceptions: FormControl<string>;
}

const fields = standardCreateSchema.shape;

/**
 * Adds or changes a standard: an explicit, measurable statement with a target, its evidence
 * and its exceptions (REFERENCES.md §C). Only the parameters the chosen measure needs are asked.
 */
@Component({
  selector: 'tm-standard-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatDialogModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule, ReactiveFormsModule],
  templateUrl: './standard-dialog.html',
  styleUrl: './standard-dialog.scss',
})
export class StandardDialog {
  private readonly api = inject(AuditsApi);
  private readonly dialogRef = inject<MatDialogRef<StandardDialog, StandardView>>(MatDialogRef);
  private readonly destroyRef = inject(DestroyRef);
  protected readonly data = inject<StandardDialogData>(MAT_DIALOG_DATA);

  protected readonly isEdit = this.data.standard !== undefined;
  protected readonly metrics = STANDARD_METRICS;
  protected readonly metricInfo = STANDARD_METRIC_INFO;
  protected readonly grades = CLAVIEN_DINDO_GRADES;
  protected readonly gradeLabels = CLAVIEN_DINDO_LABELS;
  protected readonly fieldMessage = fieldMessage;

  protected readonly form = new FormGroup<StandardForm>({
    criterion: new FormControl(this.data.standard?.criterion ?? '', { nonNullable: true, validators: zodValidator(fields.criterion) }),
    metric: new FormControl(this.data.standard?.metric ?? null, { validators: requiredZodValidator(fields.metric, 'Choose a measure.') }),
    intervalKey: new FormControl(this.data.standard?.intervalKey ?? null),
    thresholdMm: new FormControl(this.data.standard?.thresholdMm ?? null, { validators: zodValidator(fields.thresholdMm) }),
    thresholdPct: new FormControl(this.data.standard?.thresholdPct ?? null, { validators: zodValidator(fields.thresholdPct) }),
    minGrade: new FormControl(this.data.standard?.minGrade ?? null),
    comparator: new FormControl(this.data.standard?.comparator ?? '>=', { nonNullable: true }),
    target: new FormControl(this.data.standard?.target ?? null, { validators: requiredZodValidator(fields.target, 'Enter the target.') }),
    evidenceSource: new FormControl(this.data.standard?.evidenceSource ?? '', { nonNullable: true, validators: zodValidator(fields.evidenceSource) }),
    exceptions: new FormControl(this.data.standard?.exceptions ?? '', { nonNullable: true, validators: zodValidator(fields.exceptions) }),
  });

  private readonly metric = toSignal(this.form.controls.metric.valueChanges.pipe(startWith(this.form.controls.metric.value)), {
    initialValue: this.form.controls.metric.value,
  });
  /** What the chosen measure needs; null until one is chosen. */
  protected readonly info = computed(() => {
    const metric = this.metric();
    return metric ? STANDARD_METRIC_INFO[metric] : null;
  });

  protected readonly isSaving = signal(false);
  protected readonly failure = signal<string | null>(null);

  constructor() {
    this.form.controls.metric.valueChanges.pipe(takeUntilDestroyed()).subscribe((metric) => {
      // Each measure reads best one way round (lower rebound, higher completion): start there.
      if (metric) this.form.controls.comparator.setValue(STANDARD_METRIC_INFO[metric].usualComparator);
    });
  }

  protected saveStandard(): void {
    if (this.isSaving()) return;
    this.failure.set(null);
    revalidate(this.form);
    const request = this.request();
    const parsed = request ? standardCreateSchema.safeParse(request) : null;
    if (parsed && !parsed.success) placeFieldMessages(this.form, issueMessages(parsed.error.issues), SCHEMA_ERROR);
    if (this.form.invalid || !request || !parsed?.success) {
      this.form.markAllAsTouched();
      return;
    }
    this.isSaving.set(true);
    const existing = this.data.standard;
    const call = existing ? this.api.updateStandard(existing.id, { ...request, version: existing.version }) : this.api.addStandard(this.data.auditId, request);
    call.pipe(takeUntilDestroyed(this.destroyRef)).subscribe({
      next: (saved) => this.dialogRef.close(saved),
      error: (error: unknown) => {
        this.isSaving.set(false);
        this.showFailure(error);
      },
    });
  }

  /** The standard as the API takes it: parameters the measure does not use go as null. */
  private request(): StandardCreateRequest | null {
    const value = this.form.getRawValue();
    const info = this.info();
    if (!value.metric || !info || value.target === null) return null;
    return {
      criterion: value.criterion,
      metric: value.metric,
      intervalKey: info.needsInterval ? value.intervalKey : null,
      thresholdMm: info.needsThresholdMm ? value.thresholdMm : null,
      thresholdPct: info.needsThresholdPct ? value.thresholdPct : null,
      minGrade: info.needsGrade ? value.minGrade : null,
      comparator: value.comparator,
      target: value.target,
      evidenceSource: value.evidenceSource,
      exceptions: value.exceptions,
    };
  }

  private showFailure(error: unknown): void {
    if (!(error instanceof HttpErrorResponse)) {
      this.failure.set('The standard could not be saved. Try again.');
      return;
    }
    if (error.status === 409) {
      this.failure.set('Someone else changed this standard since you opened it. Close the dialog and reload the audit to see their version.');
      return;
    }
    const details = apiErrorDetails(error);
    const unplaced = placeFieldMessages(this.form, details?.fields ?? {}, SERVER_ERROR);
    if (!details?.fields || unplaced.length > 0) {
      this.failure.set([details && error.status < 500 ? details.message : describeHttpError(error), ...unplaced].join(' '));
    }
  }
}
