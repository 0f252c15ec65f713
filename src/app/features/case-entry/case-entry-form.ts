import { AbstractControl, FormArray, FormControl, FormGroup, ValidatorFn } from '@angular/forms';
import {
  SITE_LOCATIONS,
  caseCreateSchema,
  isoDate,
  patientCreateSchema,
  siteFieldsSchema,
  todayIso,
  type DiabetesStatus,
  type Indication,
  type Instrument,
  type PhenotypeMethod,
  type Procedure,
  type ReferencePoint,
  type Phenotype,
  type Sex,
  type SiteLocation,
  type SmokingStatus,
} from '@tidemark/shared';
import { z } from 'zod';
import { requiredZodValidator } from '../../shared/forms/required-zod-validator';
import { SCHEMA_ERROR, zodValidator } from '../../shared/forms/zod-validator';

/** Whether the case is for a patient already on file or one registered now. */
export type PatientMode = 'existing' | 'new';
/** The statuses a case may be registered with. */
export type InitialStatus = 'planned' | 'operated';

/** A new pseudonymised patient (DESIGN.md §7: a code, never a name). */
export interface NewPatientForm {
  code: FormControl<string>;
  birthYear: FormControl<number | null>;
  sex: FormControl<Sex | null>;
  smoking: FormControl<SmokingStatus | null>;
  cigarettesPerDay: FormControl<number | null>;
  diabetes: FormControl<DiabetesStatus | null>;
  phenotype: FormControl<Phenotype | null>;
  phenotypeMethod: FormControl<PhenotypeMethod | null>;
}

/** Step one: an existing patient or a new one; the unused half is disabled. */
export interface PatientChoiceForm {
  mode: FormControl<PatientMode>;
  existingId: FormControl<number | null>;
  newPatient: FormGroup<NewPatientForm>;
}

/** Step two: the surgery and the patient's readiness for it. */
export interface CaseDetailsForm {
  operatorId: FormControl<number | null>;
  surgeryDate: FormControl<string>;
  procedure: FormControl<Procedure | null>;
  indication: FormControl<Indication | null>;
  instrument: FormControl<Instrument | null>;
  hygienePhaseComplete: FormControl<boolean>;
  bleedingScorePct: FormControl<number | null>;
  plaqueScorePct: FormControl<number | null>;
  deepestProbingMm: FormControl<number | null>;
  sutureResorbable: FormControl<boolean | null>;
  sutureSize: FormControl<string | null>;
  provisionalRestorations: FormControl<boolean>;
  status: FormControl<InitialStatus>;
  intraOperativeEvents: FormControl<string>;
  notes: FormControl<string>;
}

/** One site: where it is (steps three) and its readings before and just after surgery (step four). */
export interface SiteForm {
  tooth: FormControl<number>;
  location: FormControl<SiteLocation>;
  referencePoint: FormControl<ReferencePoint>;
  baselineRefGm: FormControl<number | null>;
  probingDepth: FormControl<number | null>;
  ktWidth: FormControl<number | null>;
  marginToCrest: FormControl<number | null>;
  papillaScore: FormControl<number | null>;
  plannedExcision: FormControl<number | null>;
  postOpRefGm: FormControl<number | null>;
}

/** The whole New case form, one group per step (sites serve steps three and four). */
export interface CaseEntryForm {
  patient: FormGroup<PatientChoiceForm>;
  details: FormGroup<CaseDetailsForm>;
  sites: FormArray<FormGroup<SiteForm>>;
}

const caseShape = caseCreateSchema.shape;
const patientShape = patientCreateSchema.shape;
const siteShape = siteFieldsSchema.shape;

/** An operated case cannot have a future surgery date (the server's rule, said before saving). */
const surgeryNotFutureWhenOperated: ValidatorFn = (control) => {
  const status: unknown = control.parent?.get('status')?.value;
  return status === 'operated' && typeof control.value === 'string' && control.value > todayIso()
    ? { [SCHEMA_ERROR]: 'Cannot be in the future for an operated case.' }
    : null;
};

/**
 * Builds the New case form with the shared zod schemas as validators, and wires the rules
 * between fields: the unused patient half is disabled, cigarettes a day only for a current
 * smoker, post-op readings only once operated.
 *
 * @param operatorId the operator to preset (the signed-in clinician), or null to choose
 */
export function createCaseEntryForm(operatorId: number | null): FormGroup<CaseEntryForm> {
  const nonNullable = true;
  const form = new FormGroup<CaseEntryForm>({
    patient: new FormGroup<PatientChoiceForm>({
      mode: new FormControl<PatientMode>('new', { nonNullable }),
      existingId: new FormControl<number | null>(
        { value: null, disabled: true },
        { nonNullable, validators: requiredZodValidator(z.number().int().positive(), 'Choose a patient from the results.') },
      ),
      newPatient: new FormGroup<NewPatientForm>({
        code: new FormControl('', { nonNullable, validators: requiredZodValidator(patientShape.code, 'Enter the patient code.') }),
        birthYear: new FormControl<number | null>(null, {
          nonNullable,
          validators: requiredZodValidator(patientShape.birthYear, 'Enter the birth year.'),
        }),
        sex: new FormControl<Sex | null>(null, { nonNullable, validators: zodValidator(patientShape.sex) }),
        smoking: new FormControl<SmokingStatus | null>(null, { nonNullable, validators: zodValidator(patientShape.smoking) }),
        cigarettesPerDay: new FormControl<number | null>(
          { value: null, disabled: true },
          { nonNullable, validators: requiredZodValidator(patientShape.cigarettesPerDay, 'Enter cigarettes a day.') },
        ),
        diabetes: new FormControl<DiabetesStatus | null>(null, { nonNullable, validators: zodValidator(patientShape.diabetes) }),
        phenotype: new FormControl<Phenotype | null>(null, { nonNullable, validators: zodValidator(patientShape.phenotype) }),
        phenotypeMethod: new FormControl<PhenotypeMethod | null>(null, {
          nonNullable,
          validators: zodValidator(patientShape.phenotypeMethod),
        }),
      }),
    }),
    details: new FormGroup<CaseDetailsForm>({
      operatorId: new FormControl<number | null>(operatorId, {
        nonNullable,
        validators: requiredZodValidator(caseShape.operatorId, 'Choose the operator.'),
      }),
      surgeryDate: new FormControl(todayIso(), {
        nonNullable,
        validators: [requiredZodValidator(isoDate, 'Enter the surgery date.'), surgeryNotFutureWhenOperated],
      }),
      procedure: new FormControl<Procedure | null>(null, { nonNullable, validators: zodValidator(caseShape.procedure) }),
      indication: new FormControl<Indication | null>(null, { nonNullable, validators: zodValidator(caseShape.indication) }),
      instrument: new FormControl<Instrument | null>(null, { nonNullable, validators: zodValidator(caseShape.instrument) }),
      hygienePhaseComplete: new FormControl(false, { nonNullable }),
      bleedingScorePct: new FormControl<number | null>(null, { nonNullable, validators: zodValidator(caseShape.bleedingScorePct) }),
      plaqueScorePct: new FormControl<number | null>(null, { nonNullable, validators: zodValidator(caseShape.plaqueScorePct) }),
      deepestProbingMm: new FormControl<number | null>(null, { nonNullable, validators: zodValidator(caseShape.deepestProbingMm) }),
      sutureResorbable: new FormControl<boolean | null>(null, { nonNullable }),
      sutureSize: new FormControl<string | null>(null, { nonNullable, validators: zodValidator(caseShape.sutureSize) }),
      provisionalRestorations: new FormControl(false, { nonNullable }),
      status: new FormControl<InitialStatus>('planned', { nonNullable }),
      intraOperativeEvents: new FormControl({ value: '', disabled: true }, { nonNullable, validators: zodValidator(caseShape.intraOperativeEvents) }),
      notes: new FormControl('', { nonNullable, validators: zodValidator(caseShape.notes) }),
    }),
    sites: new FormArray<FormGroup<SiteForm>>([], { validators: (array) => (array.value.length ? null : { [SCHEMA_ERROR]: 'Choose at least one tooth.' }) }),
  });
  wireFieldRules(form);
  return form;
}

function wireFieldRules(form: FormGroup<CaseEntryForm>): void {
  const { patient, details } = form.controls;
  // These subscriptions live exactly as long as the form: both ends belong to it.
  patient.controls.mode.valueChanges.subscribe((mode) => {
    if (mode === 'existing') {
      patient.controls.existingId.enable();
      patient.controls.newPatient.disable();
    } else {
      patient.controls.existingId.disable();
      patient.controls.newPatient.enable();
      syncCigarettes(patient.controls.newPatient);
      patient.controls.newPatient.updateValueAndValidity();
    }
  });
  patient.controls.newPatient.controls.smoking.valueChanges.subscribe(() => syncCigarettes(patient.controls.newPatient));
  details.controls.status.valueChanges.subscribe((status) => {
    details.controls.surgeryDate.updateValueAndValidity();
    toggle(details.controls.intraOperativeEvents, status === 'operated');
    for (const site of form.controls.sites.controls) {
      toggle(site.controls.postOpRefGm, status === 'operated');
    }
  });
}

/**
 * Cigarettes a day only for a current smoker. `onlySelf`: this runs inside the smoking
 * control's change (the group recomputes right after) and while the whole patient half is
 * being disabled, where touching the group would revive its status mid-way.
 */
function syncCigarettes(patient: FormGroup<NewPatientForm>): void {
  const cigarettes = patient.controls.cigarettesPerDay;
  const quietly = { onlySelf: true, emitEvent: false };
  if (patient.controls.smoking.value === 'current' && patient.enabled) {
    cigarettes.enable(quietly);
  } else {
    cigarettes.reset(null, quietly);
    cigarettes.disable(quietly);
  }
}

function toggle(control: AbstractControl, isEnabled: boolean): void {
  if (isEnabled) {
    control.enable();
  } else {
    control.disable();
  }
}

/** Incisal edge on incisors, cusp tip elsewhere: the usual fixed reference, easily changed. */
export function defaultReferencePoint(tooth: number): ReferencePoint {
  return tooth % 10 <= 2 ? 'incisal-edge' : 'cusp-tip';
}

/** A site's controls, validated by the shared site schema. */
export function createSiteGroup(tooth: number, location: SiteLocation, isOperated: boolean): FormGroup<SiteForm> {
  const nonNullable = true;
  const reading = (schema: z.ZodType, disabled = false) =>
    new FormControl<number | null>({ value: null, disabled }, { nonNullable, validators: zodValidator(schema) });
  return new FormGroup<SiteForm>({
    tooth: new FormControl(tooth, { nonNullable, validators: zodValidator(siteShape.tooth) }),
    location: new FormControl(location, { nonNullable, validators: zodValidator(siteShape.location) }),
    referencePoint: new FormControl(defaultReferencePoint(tooth), { nonNullable, validators: zodValidator(siteShape.referencePoint) }),
    baselineRefGm: reading(siteShape.baselineRefGm),
    probingDepth: reading(siteShape.probingDepth),
    ktWidth: reading(siteShape.ktWidth),
    marginToCrest: reading(siteShape.marginToCrest),
    // The Jemt index scores interdental papillae only.
    papillaScore: reading(siteShape.papillaScore, location === 'mid-facial'),
    plannedExcision: reading(siteShape.plannedExcision),
    postOpRefGm: reading(siteShape.postOpRefGm, !isOperated),
  });
}

/** Sort key keeping sites in FDI order, then mid-facial, mesial, distal. */
function siteOrder(tooth: number, location: SiteLocation): number {
  return tooth * 10 + SITE_LOCATIONS.indexOf(location);
}

/** Adds a site at its place in FDI order, unless it is there already. */
export function addSite(form: FormGroup<CaseEntryForm>, tooth: number, location: SiteLocation): void {
  const sites = form.controls.sites;
  if (sites.controls.some((site) => site.controls.tooth.value === tooth && site.controls.location.value === location)) {
    return;
  }
  const key = siteOrder(tooth, location);
  const index = sites.controls.findIndex((site) => siteOrder(site.controls.tooth.value, site.controls.location.value) > key);
  const group = createSiteGroup(tooth, location, form.controls.details.controls.status.value === 'operated');
  sites.insert(index === -1 ? sites.length : index, group);
}

/** Removes one site. */
export function removeSite(form: FormGroup<CaseEntryForm>, tooth: number, location: SiteLocation): void {
  const sites = form.controls.sites;
  const index = sites.controls.findIndex((site) => site.controls.tooth.value === tooth && site.controls.location.value === location);
  if (index !== -1) {
    sites.removeAt(index);
  }
}

/** Adds a tooth with its mid-facial site, or removes the tooth and all its sites. */
export function toggleTooth(form: FormGroup<CaseEntryForm>, tooth: number): void {
  const sites = form.controls.sites;
  if (sites.controls.some((site) => site.controls.tooth.value === tooth)) {
    for (let index = sites.length - 1; index >= 0; index -= 1) {
      if (sites.at(index).controls.tooth.value === tooth) {
        sites.removeAt(index);
      }
    }
  } else {
    addSite(form, tooth, 'mid-facial');
  }
}
