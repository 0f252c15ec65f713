import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, DestroyRef, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule, ValidatorFn } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import {
  CLAVIEN_DINDO_GRADES,
  CLAVIEN_DINDO_LABELS,
  COMPLICATION_TYPES,
  COMPLICATION_TYPE_LABELS,
  changeReason,
  complicationCreateSchema,
  todayIso,
  type ClavienDindoGrade,
  type ComplicationType,
  type ComplicationView,
  type VisitView,
} from '@tidemark/shared';
import { Observable } from 'rxjs';
import type { z } from 'zod';
import { apiErrorDetails } from '../../../core/http/api-error-details';
import { describeHttpError } from '../../../core/http/describe-http-error';
import { requiredZodValidator } from '../../../shared/forms/required-zod-validator';
import { SCHEMA_ERROR, SERVER_ERROR, fieldMessage, zodValidator } from '../../../shared/forms/zod-validator';
import { CasesApi } from '../cases-api';

/** What the dialog works on: a new complication of a case, or a correction of an existing one. */
export interface ComplicationDialogData {
  readonly caseId: number;
  readonly visits: readonly VisitView[];
  /** Present when correcting; its version is sent back and a reason is asked for. */
  readonly complication?: ComplicationView;
}

/** The complication form's controls. */
interface ComplicationForm {
  type: FormControl<ComplicationType | null>;
  grade: FormControl<ClavienDindoGrade | null>;
  onsetDate: FormControl<string>;
  resolutionDate: FormControl<string>;
  visitId: FormControl<number | null>;
  management: FormControl<string>;
  reason: FormControl<string>;
}

const shape = complicationCreateSchema.shape;

/** A complication as the schema hands it over once every field passed. */
type ComplicationFields = z.output<typeof complicationCreateSchema>;

/** Records or corrects a complication, checked with the same schema the server uses. */
@Component({
  selector: 'tm-complication-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatDialogModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule, ReactiveFormsModule],
  templateUrl: './complication-dialog.html',
  styleUrl: './complication-dialog.scss',
})
export class ComplicationDialog {
  private readonly api = inject(CasesApi);
  private readonly dialogRef = inject<MatDialogRef<ComplicationDialog, ComplicationView>>(MatDialogRef);
  private readonly destroyRef = inject(DestroyRef);
  protected readonly data = inject<ComplicationDialogData>(MAT_DIALOG_DATA);

  protected readonly isCorrection = this.data.complication !== undefined;
  protected readonly types = COMPLICATION_TYPES;
  protected readonly typeLabels = COMPLICATION_TYPE_LABELS;
  protected readonly grades = CLAVIEN_DINDO_GRADES;
  protected readonly gradeLabels = CLAVIEN_DINDO_LABELS;
  protected readonly today = todayIso();
  protected readonly fieldMessage = fieldMessage;

  protected readonly form = new FormGroup<ComplicationForm>({
    type: new FormControl(this.data.complication?.type ?? null, { validators: zodValidator(shape.type) }),
    grade: new FormControl(this.data.complication?.grade ?? null, { validators: zodValidator(shape.grade) }),
    onsetDate: new FormControl(this.data.complication?.onsetDate ?? '', { nonNullable: true, validators: requiredZodValidator(shape.onsetDate, 'Enter the date it began.') }),
    resolutionDate: new FormControl(this.data.complication?.resolutionDate ?? '', {
      nonNullable: true,
      validators: unlessEmpty(zodValidator(shape.resolutionDate)),
    }),
    visitId: new FormControl(this.data.complication?.visitId ?? null),
    management: new FormControl(this.data.complication?.management ?? '', { nonNullable: true, validators: zodValidator(shape.management) }),
    reason: new FormControl('', { nonNullable: true, validators: this.data.complication ? zodValidator(changeReason) : [] }),
  });

  protected readonly isSaving = signal(false);
  protected readonly failure = signal<string | null>(null);

  protected saveComplication(): void {
    if (this.isSaving()) {
      return;
    }
    this.failure.set(null);
    const value = this.form.getRawValue();
    // The whole schema once more, for the rule across fields (resolution not before onset).
    const parsed = complicationCreateSchema.safeParse({
      type: value.type ?? undefined,
      grade: value.grade ?? undefined,
      onsetDate: value.onsetDate,
      resolutionDate: value.resolutionDate || null,
      visitId: value.visitId,
      management: value.management,
    });
    if (!parsed.success) {
      // Fields already failing say so in their own words; add only what the field checks cannot see.
      for (const issue of parsed.error.issues) {
        const name = String(issue.path[0] ?? '');
        if (this.isFormField(name) && this.form.controls[name].valid) {
          this.showOnField(name, issue.message, SCHEMA_ERROR);
        }
      }
    }
    if (this.form.invalid || !parsed.success) {
      this.form.markAllAsTouched();
      return;
    }
    this.isSaving.set(true);
    this.save(parsed.data)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (saved) => this.dialogRef.close(saved),
        error: (error: unknown) => {
          this.isSaving.set(false);
          this.showFailure(error);
        },
      });
  }

  private save(complication: ComplicationFields): Observable<ComplicationView> {
    const existing = this.data.complication;
    if (!existing) {
      return this.api.addComplication(this.data.caseId, complication);
    }
    const { visitId: _visitId, ...fields } = complication;
    return this.api.updateComplication(existing.id, { ...fields, version: existing.version, reason: this.form.controls.reason.value.trim() });
  }

  private showFailure(error: unknown): void {
    if (!(error instanceof HttpErrorResponse)) {
      this.failure.set('The complication could not be saved. Try again.');
      return;
    }
    const details = apiErrorDetails(error);
    let isShownOnField = false;
    for (const [name, message] of Object.entries(details?.fields ?? {})) {
      isShownOnField = this.showOnField(name, message, SERVER_ERROR) || isShownOnField;
    }
    if (!isShownOnField) {
      this.failure.set(details && error.status < 500 ? details.message : describeHttpError(error));
    }
  }

  /** Puts a message under the named field; false when the form has no such field. */
  private showOnField(name: string, message: string, key: string): boolean {
    if (!this.isFormField(name)) {
      return false;
    }
    const control = this.form.controls[name];
    control.setErrors({ ...control.errors, [key]: message });
    control.markAsTouched();
    return true;
  }

  private isFormField(name: string): name is keyof ComplicationForm {
    return name in this.form.controls;
  }
}

/** Runs `validator` only when the field has something in it (optional dates). */
function unlessEmpty(validator: ValidatorFn): ValidatorFn {
  return (control) => (control.value === '' ? null : validator(control));
}
