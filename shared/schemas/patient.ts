import * as z from 'zod';
import { DIABETES_STATUSES, PHENOTYPE_METHODS, PHENOTYPES, SEXES, SMOKING_STATUSES } from '../types/clinical-terms';
import { changeReason, version } from './clinical-fields';

/**
 * A pseudonymised patient: a practice code, never a name, address, full birth date or record number.
 * Codes: 3–20 letters, digits and hyphens (e.g. "HP-0042").
 */
const patientFields = {
  code: z
    .string()
    .trim()
    .toUpperCase()
    .regex(/^[A-Z0-9][A-Z0-9-]{2,19}$/, 'Use 3–20 letters, digits or hyphens (a pseudonymous code, never a name).'),
  birthYear: z.number().int('Enter a year.').min(1900, 'Enter a year from 1900.').max(new Date().getUTCFullYear(), 'Cannot be in the future.'),
  sex: z.enum(SEXES, { message: 'Choose one.' }),
  smoking: z.enum(SMOKING_STATUSES, { message: 'Choose one.' }),
  cigarettesPerDay: z.number().int().min(1, 'At least 1.').max(100).nullable().default(null),
  diabetes: z.enum(DIABETES_STATUSES, { message: 'Choose one.' }),
  phenotype: z.enum(PHENOTYPES, { message: 'Choose one.' }),
  phenotypeMethod: z.enum(PHENOTYPE_METHODS, { message: 'Choose one.' }),
};

const cigarettesRule = {
  check: (patient: { smoking?: string; cigarettesPerDay?: number | null }) =>
    patient.smoking === undefined || (patient.smoking === 'current') === (patient.cigarettesPerDay != null),
  message: 'Give cigarettes a day for a current smoker, and only then.',
  path: ['cigarettesPerDay'],
};

/** `POST /api/patients` body. */
export const patientCreateSchema = z
  .object(patientFields)
  .refine(cigarettesRule.check, { message: cigarettesRule.message, path: cigarettesRule.path });
export type PatientCreateRequest = z.input<typeof patientCreateSchema>;
export type PatientCreate = z.output<typeof patientCreateSchema>;

/** `PATCH /api/patients/:id` body: any subset of the fields (the code never changes), with version and reason. */
export const patientUpdateSchema = z
  .object({
    birthYear: patientFields.birthYear.optional(),
    sex: patientFields.sex.optional(),
    smoking: patientFields.smoking.optional(),
    cigarettesPerDay: z.number().int().min(1, 'At least 1.').max(100).nullable().optional(),
    diabetes: patientFields.diabetes.optional(),
    phenotype: patientFields.phenotype.optional(),
    phenotypeMethod: patientFields.phenotypeMethod.optional(),
    version,
    reason: changeReason,
  })
  .refine(cigarettesRule.check, { message: cigarettesRule.message, path: cigarettesRule.path });
export type PatientUpdateRequest = z.input<typeof patientUpdateSchema>;

/** A patient as the API returns it. */
export interface PatientView {
  id: number;
  code: string;
  birthYear: number;
  sex: z.infer<typeof patientFields.sex>;
  smoking: z.infer<typeof patientFields.smoking>;
  cigarettesPerDay: number | null;
  diabetes: z.infer<typeof patientFields.diabetes>;
  phenotype: z.infer<typeof patientFields.phenotype>;
  phenotypeMethod: z.infer<typeof patientFields.phenotypeMethod>;
  version: number;
}
