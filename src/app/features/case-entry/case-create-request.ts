import { FormGroup } from '@angular/forms';
import { caseCreateSchema, type CaseCreate } from '@tidemark/shared';
import type { CaseEntryForm } from './case-entry-form';

/** The request, or field errors keyed like the server's (`sites.0.tooth`). */
export type CaseCreateCandidate = { isValid: true; request: CaseCreate } | { isValid: false; fields: Record<string, string> };

/**
 * Turns the form into a `POST /api/cases` body and checks it with the same schema the
 * server uses, so rules across fields (one site per tooth and location, patient or patient
 * id) are caught before sending. Fields that do not apply are sent as null.
 */
export function caseCreateRequest(form: FormGroup<CaseEntryForm>): CaseCreateCandidate {
  const { patient, details, sites } = form.getRawValue();
  const { status, intraOperativeEvents, ...caseFields } = details;
  const isOperated = status === 'operated';
  const candidate = {
    ...(patient.mode === 'existing'
      ? { patientId: patient.existingId }
      : {
          patient: {
            ...patient.newPatient,
            cigarettesPerDay: patient.newPatient.smoking === 'current' ? patient.newPatient.cigarettesPerDay : null,
          },
        }),
    ...caseFields,
    status,
    intraOperativeEvents: isOperated ? intraOperativeEvents : '',
    sites: sites.map((site) => ({
      ...site,
      papillaScore: site.location === 'mid-facial' ? null : site.papillaScore,
      postOpRefGm: isOperated ? site.postOpRefGm : null,
    })),
  };
  const result = caseCreateSchema.safeParse(candidate);
  if (result.success) {
    return { isValid: true, request: result.data };
  }
  const fields: Record<string, string> = {};
  for (const issue of result.error.issues) {
    fields[issue.path.join('.') || '_'] ??= issue.message;
  }
  return { isValid: false, fields };
}

/** Case fields that live in the "details" group, keyed as the server names them. */
const DETAIL_FIELDS: ReadonlySet<string> = new Set([
  'operatorId',
  'surgeryDate',
  'procedure',
  'indication',
  'instrument',
  'hygienePhaseComplete',
  'bleedingScorePct',
  'plaqueScorePct',
  'deepestProbingMm',
  'sutureResorbable',
  'sutureSize',
  'provisionalRestorations',
  'status',
  'intraOperativeEvents',
  'notes',
]);

/** Where a server field error belongs: the control path in the form and the step that shows it. */
export interface ErrorPlace {
  path: (string | number)[];
  step: number;
}

/** Step indexes of the New case stepper. */
export const STEP = { patient: 0, details: 1, sites: 2, baseline: 3 } as const;

/**
 * Maps a server field path (`patient.code`, `patientId`, `surgeryDate`, `sites`, `sites.0.tooth`)
 * to the control that shows it; null when no control fits (shown as a general message).
 */
export function errorPlace(serverPath: string): ErrorPlace | null {
  const [head = '', ...rest] = serverPath.split('.');
  if (head === 'patientId') {
    return { path: ['patient', 'existingId'], step: STEP.patient };
  }
  if (head === 'patient') {
    return { path: rest.length ? ['patient', 'newPatient', ...rest] : ['patient'], step: STEP.patient };
  }
  if (DETAIL_FIELDS.has(head) && rest.length === 0) {
    return { path: ['details', head], step: STEP.details };
  }
  if (head === 'sites') {
    const [index, field] = rest;
    if (index === undefined || !/^\d+$/.test(index)) {
      return { path: ['sites'], step: STEP.sites };
    }
    const where = field === undefined || field === 'tooth' || field === 'location' ? STEP.sites : STEP.baseline;
    return { path: field === undefined ? ['sites', Number(index)] : ['sites', Number(index), field], step: where };
  }
  return null;
}
