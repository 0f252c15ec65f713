import { FormControl, FormGroup, type ValidatorFn } from '@angular/forms';
import { auditCreateSchema, cohortSchema, isoDate, type AuditCreateRequest, type AuditView, type CohortDefinition, type CohortDefinitionInput } from '@tidemark/shared';
import { requiredZodValidator } from '../../../shared/forms/required-zod-validator';
import { zodValidator } from '../../../shared/forms/zod-validator';

/** The cohort builder's controls; every list empty means "any". Dates are '' while not set. */
export interface CohortForm {
  surgeryFrom: FormControl<string>;
  surgeryTo: FormControl<string>;
  procedures: FormControl<CohortDefinition['procedures']>;
  operatorIds: FormControl<number[]>;
  phenotypes: FormControl<CohortDefinition['phenotypes']>;
  indications: FormControl<CohortDefinition['indications']>;
  smoking: FormControl<CohortDefinition['smoking']>;
  diabetes: FormControl<CohortDefinition['diabetes']>;
  regions: FormControl<CohortDefinition['regions']>;
  teeth: FormControl<number[]>;
}

/** An audit's scope form; its shape mirrors `auditCreateSchema`, so issue paths name controls directly. */
export interface AuditForm {
  title: FormControl<string>;
  rationale: FormControl<string>;
  scheduleId: FormControl<number | null>;
  thresholds: FormGroup<{ stable: FormControl<number | null>; relapse: FormControl<number | null> }>;
  reauditDate: FormControl<string>;
  cohort: FormGroup<CohortForm>;
}

const shape = auditCreateSchema.shape;
const thresholdShape = shape.thresholds.unwrap().shape;

/** Runs `validator` only when the field has something in it (optional dates). */
export function unlessEmpty(validator: ValidatorFn): ValidatorFn {
  return (control) => (control.value === '' || control.value === null ? null : validator(control));
}

function optionalDate(): FormControl<string> {
  return new FormControl('', { nonNullable: true, validators: unlessEmpty(zodValidator(isoDate)) });
}

function list<T>(): FormControl<T[]> {
  return new FormControl<T[]>([], { nonNullable: true });
}

/** A fresh scope form with the practice defaults (stable ≤ 0.5 mm, relapse > 1.0 mm; DESIGN.md §3). */
export function createAuditForm(): FormGroup<AuditForm> {
  return new FormGroup<AuditForm>({
    title: new FormControl('', { nonNullable: true, validators: zodValidator(shape.title) }),
    rationale: new FormControl('', { nonNullable: true, validators: zodValidator(shape.rationale) }),
    scheduleId: new FormControl<number | null>(null, { validators: requiredZodValidator(shape.scheduleId, 'Choose a recall schedule.') }),
    thresholds: new FormGroup({
      stable: new FormControl<number | null>(0.5, { validators: requiredZodValidator(thresholdShape.stable, 'Enter the stable limit in mm.') }),
      relapse: new FormControl<number | null>(1, { validators: requiredZodValidator(thresholdShape.relapse, 'Enter the relapse limit in mm.') }),
    }),
    reauditDate: optionalDate(),
    cohort: new FormGroup<CohortForm>({
      surgeryFrom: optionalDate(),
      surgeryTo: optionalDate(),
      procedures: list(),
      operatorIds: list(),
      phenotypes: list(),
      indications: list(),
      smoking: list(),
      diabetes: list(),
      regions: list(),
      teeth: list(),
    }),
  });
}

/** Shows an audit's current scope in the form, as untouched. */
export function fillAuditForm(form: FormGroup<AuditForm>, audit: AuditView): void {
  const cohort = audit.cohort;
  form.reset({
    title: audit.title,
    rationale: audit.rationale,
    scheduleId: audit.schedule.id,
    thresholds: { stable: audit.thresholds.stable, relapse: audit.thresholds.relapse },
    reauditDate: audit.reauditDate ?? '',
    cohort: {
      surgeryFrom: cohort.surgeryFrom ?? '',
      surgeryTo: cohort.surgeryTo ?? '',
      procedures: [...cohort.procedures],
      operatorIds: [...cohort.operatorIds],
      phenotypes: [...cohort.phenotypes],
      indications: [...cohort.indications],
      smoking: [...cohort.smoking],
      diabetes: [...cohort.diabetes],
      regions: [...cohort.regions],
      teeth: [...cohort.teeth],
    },
  });
}

/** The cohort controls' value as the API takes it (unset dates are null). */
export function cohortFromForm(value: ReturnType<FormGroup<CohortForm>['getRawValue']>): CohortDefinitionInput {
  return { ...value, surgeryFrom: value.surgeryFrom || null, surgeryTo: value.surgeryTo || null };
}

/** The cohort as the server will read it, or null while a date is unfinished or the range runs backwards. */
export function parsedCohort(value: ReturnType<FormGroup<CohortForm>['getRawValue']>): CohortDefinition | null {
  const parsed = cohortSchema.safeParse(cohortFromForm(value));
  return parsed.success ? parsed.data : null;
}

/**
 * The whole form as a create request (the update adds the version), or null while a required
 * number is empty — the field validators already say so under the field.
 */
export function auditRequestFromForm(form: FormGroup<AuditForm>): AuditCreateRequest | null {
  const value = form.getRawValue();
  const { stable, relapse } = value.thresholds;
  if (value.scheduleId === null || stable === null || relapse === null) return null;
  return {
    title: value.title,
    rationale: value.rationale,
    scheduleId: value.scheduleId,
    thresholds: { stable, relapse },
    cohort: cohortFromForm(value.cohort),
    reauditDate: value.reauditDate || null,
  };
}
