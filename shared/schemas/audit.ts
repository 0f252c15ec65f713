import * as z from 'zod';
import { DIABETES_STATUSES, INDICATIONS, PHENOTYPES, PROCEDURES, SMOKING_STATUSES } from '../types/clinical-terms';
import { REGIONS } from '../types/regions';
import { fdiTooth, isoDate, note } from './clinical-fields';

/**
 * Who is in an audit's cohort. Every list is a filter; an empty list means "any".
 * Region and teeth select the sites audited (a case joins when one of its sites matches).
 */
export const cohortSchema = z
  .object({
    surgeryFrom: isoDate.nullable().default(null),
    surgeryTo: isoDate.nullable().default(null),
    procedures: z.array(z.enum(PROCEDURES)).max(PROCEDURES.length).default([]),
    operatorIds: z.array(z.number().int().positive()).max(100).default([]),
    phenotypes: z.array(z.enum(PHENOTYPES)).max(PHENOTYPES.length).default([]),
    indications: z.array(z.enum(INDICATIONS)).max(INDICATIONS.length).default([]),
    smoking: z.array(z.enum(SMOKING_STATUSES)).max(SMOKING_STATUSES.length).default([]),
    diabetes: z.array(z.enum(DIABETES_STATUSES)).max(DIABETES_STATUSES.length).default([]),
    regions: z.array(z.enum(REGIONS)).max(REGIONS.length).default([]),
    teeth: z.array(fdiTooth).max(52).default([]),
  })
  .refine((cohort) => !cohort.surgeryFrom || !cohort.surgeryTo || cohort.surgeryFrom <= cohort.surgeryTo, {
    message: 'The range ends before it starts.',
    path: ['surgeryTo'],
  });
export type CohortDefinition = z.output<typeof cohortSchema>;
export type CohortDefinitionInput = z.input<typeof cohortSchema>;

const thresholdsSchema = z
  .object({
    stable: z.number().min(0).max(5).refine((value) => Number.isInteger(value * 4), 'Use 0.25 mm steps.'),
    relapse: z.number().min(0).max(5).refine((value) => Number.isInteger(value * 4), 'Use 0.25 mm steps.'),
  })
  .refine((thresholds) => thresholds.stable <= thresholds.relapse, { message: 'Relapse must be at least the stable limit.', path: ['relapse'] });

/** `POST /api/audits`. */
export const auditCreateSchema = z.object({
  title: z.string().trim().min(3, 'Enter a title.').max(160),
  rationale: note(4000).default(''),
  leadId: z.number().int().positive().optional(),
  scheduleId: z.number().int().positive('Choose a recall schedule.'),
  thresholds: thresholdsSchema.default({ stable: 0.5, relapse: 1.0 }),
  cohort: cohortSchema.default({
    surgeryFrom: null,
    surgeryTo: null,
    procedures: [],
    operatorIds: [],
    phenotypes: [],
    indications: [],
    smoking: [],
    diabetes: [],
    regions: [],
    teeth: [],
  }),
  reauditDate: isoDate.nullable().default(null),
});
export type AuditCreateRequest = z.input<typeof auditCreateSchema>;

/** `PATCH /api/audits/:id`. */
export const auditUpdateSchema = z.object({
  title: z.string().trim().min(3).max(160).optional(),
  rationale: note(4000).optional(),
  leadId: z.number().int().positive().optional(),
  scheduleId: z.number().int().positive().optional(),
  thresholds: thresholdsSchema.optional(),
  cohort: cohortSchema.optional(),
  reauditDate: isoDate.nullable().optional(),
  version: z.number().int().min(1),
});
export type AuditUpdateRequest = z.input<typeof auditUpdateSchema>;

/** `POST /api/audits/cohort-preview`: the live count while a definition is edited. */
export const cohortPreviewSchema = z.object({ cohort: cohortSchema });
