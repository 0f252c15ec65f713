import { FormArray, FormControl, FormGroup, ValidatorFn } from '@angular/forms';
import {
  pastOrTodayDate,
  siteMeasurementSchema,
  todayIso,
  visitCreateSchema,
  visitUpdateSchema,
  type SiteMeasurementView,
  type SiteView,
  type VisitCreate,
  type VisitView,
} from '@tidemark/shared';
import type { z } from 'zod';
import { requiredZodValidator } from '../../shared/forms/required-zod-validator';
import { SCHEMA_ERROR, zodValidator } from '../../shared/forms/zod-validator';

/** One site's readings at the recall. */
export interface MeasurementForm {
  siteId: FormControl<number>;
  refGm: FormControl<number | null>;
  probingDepth: FormControl<number | null>;
  bleedingOnProbing: FormControl<boolean>;
  ktWidth: FormControl<number | null>;
  papillaScore: FormControl<number | null>;
}

/** The recall: visit facts, a reason when correcting, and one row per site. */
export interface RecallForm {
  visitDate: FormControl<string>;
  pain: FormControl<number | null>;
  satisfaction: FormControl<number | null>;
  notes: FormControl<string>;
  reason: FormControl<string>;
  measurements: FormArray<FormGroup<MeasurementForm>>;
}

const measurementShape = siteMeasurementSchema.shape;
const visitShape = visitCreateSchema.shape;

/** The empty recall form; rows are added once the case is known (`prepareRecallForm`). */
export function createRecallForm(): FormGroup<RecallForm> {
  const nonNullable = true;
  return new FormGroup<RecallForm>({
    visitDate: new FormControl(todayIso(), { nonNullable, validators: requiredZodValidator(pastOrTodayDate, 'Enter the visit date.') }),
    pain: new FormControl<number | null>(null, { nonNullable, validators: zodValidator(visitShape.pain) }),
    satisfaction: new FormControl<number | null>(null, { nonNullable, validators: zodValidator(visitShape.satisfaction) }),
    notes: new FormControl('', { nonNullable, validators: zodValidator(visitShape.notes) }),
    reason: new FormControl(
      { value: '', disabled: true },
      { nonNullable, validators: requiredZodValidator(visitUpdateSchema.shape.reason, 'Say why the recall is corrected.') },
    ),
    measurements: new FormArray<FormGroup<MeasurementForm>>([]),
  });
}

/** A row's controls, prefilled from a recorded measurement when correcting. */
export function createMeasurementGroup(site: SiteView, recorded: SiteMeasurementView | null): FormGroup<MeasurementForm> {
  const nonNullable = true;
  return new FormGroup<MeasurementForm>({
    siteId: new FormControl(site.id, { nonNullable }),
    refGm: new FormControl<number | null>(recorded?.refGm ?? null, {
      nonNullable,
      validators: requiredZodValidator(measurementShape.refGm, 'Enter REF→GM.'),
    }),
    probingDepth: new FormControl<number | null>(recorded?.probingDepth ?? null, {
      nonNullable,
      validators: zodValidator(measurementShape.probingDepth),
    }),
    bleedingOnProbing: new FormControl(recorded?.bleedingOnProbing ?? false, { nonNullable }),
    ktWidth: new FormControl<number | null>(recorded?.ktWidth ?? null, { nonNullable, validators: zodValidator(measurementShape.ktWidth) }),
    // The Jemt index scores interdental papillae only.
    papillaScore: new FormControl<number | null>(
      { value: recorded?.papillaScore ?? null, disabled: site.location === 'mid-facial' },
      { nonNullable, validators: zodValidator(measurementShape.papillaScore) },
    ),
  });
}

/** A recall cannot come before the surgery (the server's rule, said before saving). */
function notBefore(surgeryDate: string): ValidatorFn {
  return (control) =>
    typeof control.value === 'string' && control.value !== '' && control.value < surgeryDate
      ? { [SCHEMA_ERROR]: `Must be on or after the surgery date (${surgeryDate}).` }
      : null;
}

/**
 * Fits the form to a case: one row per site (in `sites` order), the surgery date rule, and —
 * when the interval is already recorded — the recorded values and a required reason.
 */
export function prepareRecallForm(form: FormGroup<RecallForm>, sites: readonly SiteView[], surgeryDate: string, recorded: VisitView | null): void {
  const { visitDate, reason, measurements } = form.controls;
  visitDate.setValidators([requiredZodValidator(pastOrTodayDate, 'Enter the visit date.'), notBefore(surgeryDate)]);
  measurements.clear({ emitEvent: false });
  for (const site of sites) {
    const measurement = recorded?.measurements.find((each) => each.siteId === site.id) ?? null;
    measurements.push(createMeasurementGroup(site, measurement), { emitEvent: false });
  }
  if (recorded) {
    reason.enable({ emitEvent: false });
  } else {
    reason.disable({ emitEvent: false });
  }
  // Rows are left out here, so each returns to the value it was created with (prefilled or empty).
  form.reset({
    visitDate: recorded?.visitDate ?? todayIso(),
    pain: recorded?.pain ?? null,
    satisfaction: recorded?.satisfaction ?? null,
    notes: recorded?.notes ?? '',
    reason: '',
  });
}

/** The request, or field errors keyed like the server's (`measurements.0.refGm`). */
export type VisitCandidate<T> = { isValid: true; request: T } | { isValid: false; fields: Record<string, string> };

/** The visit facts and rows as the API expects them; papilla scores only on papilla sites. */
function visitBody(form: FormGroup<RecallForm>) {
  const { visitDate, pain, satisfaction, notes, reason } = form.getRawValue();
  const measurements = form.controls.measurements.controls.map((row) => {
    const value = row.getRawValue();
    return { ...value, papillaScore: row.controls.papillaScore.enabled ? value.papillaScore : null };
  });
  return { visitDate, pain, satisfaction, notes, reason, measurements };
}

function issuesToFields(issues: readonly { path: readonly PropertyKey[]; message: string }[]): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of issues) {
    fields[issue.path.map(String).join('.') || '_'] ??= issue.message;
  }
  return fields;
}

/** `POST /api/cases/:id/visits` body, checked with the shared schema. */
export function visitCreateRequest(form: FormGroup<RecallForm>, intervalKey: string, confirmLargeChange: boolean): VisitCandidate<VisitCreate> {
  const { reason: _reason, ...body } = visitBody(form);
  const result = visitCreateSchema.safeParse({ ...body, intervalKey, confirmLargeChange });
  return result.success ? { isValid: true, request: result.data } : { isValid: false, fields: issuesToFields(result.error.issues) };
}

/** `PATCH /api/visits/:id` body for a correction, with the visit's version and the reason. */
export function visitUpdateRequest(
  form: FormGroup<RecallForm>,
  version: number,
  confirmLargeChange: boolean,
): VisitCandidate<z.output<typeof visitUpdateSchema>> {
  const result = visitUpdateSchema.safeParse({ ...visitBody(form), version, confirmLargeChange });
  return result.success ? { isValid: true, request: result.data } : { isValid: false, fields: issuesToFields(result.error.issues) };
}

/** The control a server field path names (`visitDate`, `reason`, `measurements.2.refGm`), or null. */
export function controlForPath(form: FormGroup<RecallForm>, path: string): FormControl<unknown> | null {
  const parts = path.split('.').map((part) => (/^\d+$/.test(part) ? Number(part) : part));
  const control = form.get(parts);
  return control instanceof FormControl ? control : null;
}
