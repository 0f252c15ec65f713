import * as z from 'zod';
import { CASE_STATUSES, INDICATIONS, INSTRUMENTS, PROCEDURES, REFERENCE_POINTS, SITE_LOCATIONS } from '../types/clinical-terms';
import { changeReason, fdiTooth, fdiToothParam, isoDate, millimetres, note, papillaScore, version } from './clinical-fields';
import { patientCreateSchema } from './patient';

const percentage = z.number().min(0, 'Use 0–100 %.').max(100, 'Use 0–100 %.');

/** Baseline and surgical measurements of one site (DESIGN.md §3). */
export const siteFieldsSchema = z.object({
  tooth: fdiTooth,
  location: z.enum(SITE_LOCATIONS, { message: 'Choose a location.' }),
  referencePoint: z.enum(REFERENCE_POINTS, { message: 'Choose a reference point.' }),
  baselineRefGm: millimetres,
  probingDepth: millimetres.nullable().default(null),
  ktWidth: millimetres.nullable().default(null),
  marginToCrest: millimetres.nullable().default(null),
  papillaScore: papillaScore.nullable().default(null),
  plannedExcision: millimetres.nullable().default(null),
  postOpRefGm: millimetres.nullable().default(null),
});
export type SiteFields = z.output<typeof siteFieldsSchema>;
export type SiteFieldsInput = z.input<typeof siteFieldsSchema>;

/** Case fields a clinician records (everything except patient, sites and status history). */
const caseFields = {
  operatorId: z.number().int().positive('Choose the operator.'),
  surgeryDate: isoDate,
  procedure: z.enum(PROCEDURES, { message: 'Choose a procedure.' }),
  indication: z.enum(INDICATIONS, { message: 'Choose an indication.' }),
  instrument: z.enum(INSTRUMENTS, { message: 'Choose an instrument.' }),
  hygienePhaseComplete: z.boolean(),
  bleedingScorePct: percentage.nullable().default(null),
  plaqueScorePct: percentage.nullable().default(null),
  deepestProbingMm: millimetres.nullable().default(null),
  sutureResorbable: z.boolean().nullable().default(null),
  sutureSize: z.string().trim().regex(/^\d-0$/, 'Use a size such as 5-0 or 6-0.').nullable().default(null),
  provisionalRestorations: z.boolean().default(false),
  intraOperativeEvents: note(1000).default(''),
  finalImpressionDate: isoDate.nullable().default(null),
  finalRestorationDate: isoDate.nullable().default(null),
  notes: note().default(''),
};

/** `POST /api/cases`: a case with its sites, for an existing patient (`patientId`) or a new one (`patient`). */
export const caseCreateSchema = z
  .object({
    patientId: z.number().int().positive().optional(),
    patient: patientCreateSchema.optional(),
    ...caseFields,
    status: z.enum(['planned', 'operated']).default('planned'),
    sites: z.array(siteFieldsSchema).min(1, 'Add at least one site.').max(64),
  })
  .refine((body) => (body.patientId === undefined) !== (body.patient === undefined), {
    message: 'Choose an existing patient or register a new one.',
    path: ['patientId'],
  })
  .refine((body) => new Set(body.sites.map((site) => `${site.tooth}/${site.location}`)).size === body.sites.length, {
    message: 'Each tooth and location may appear once.',
    path: ['sites'],
  });
export type CaseCreateRequest = z.input<typeof caseCreateSchema>;
export type CaseCreate = z.output<typeof caseCreateSchema>;

/** `PATCH /api/cases/:id`: any subset of case fields, a status move, with version and reason. */
export const caseUpdateSchema = z
  .object({
    surgeryDate: caseFields.surgeryDate.optional(),
    procedure: caseFields.procedure.optional(),
    indication: caseFields.indication.optional(),
    instrument: caseFields.instrument.optional(),
    hygienePhaseComplete: caseFields.hygienePhaseComplete.optional(),
    bleedingScorePct: percentage.nullable().optional(),
    plaqueScorePct: percentage.nullable().optional(),
    deepestProbingMm: millimetres.nullable().optional(),
    sutureResorbable: z.boolean().nullable().optional(),
    // No default here: a field left out of an update must stay as recorded.
    sutureSize: z.string().trim().regex(/^\d-0$/, 'Use a size such as 5-0 or 6-0.').nullable().optional(),
    provisionalRestorations: z.boolean().optional(),
    intraOperativeEvents: note(1000).optional(),
    finalImpressionDate: isoDate.nullable().optional(),
    finalRestorationDate: isoDate.nullable().optional(),
    notes: note().optional(),
    status: z.enum(CASE_STATUSES).optional(),
    withdrawnReason: note(500).optional(),
    version,
    reason: changeReason,
  })
  .refine((body) => body.status !== 'withdrawn' || (body.withdrawnReason ?? '').length >= 3, {
    message: 'Say why the case is withdrawn.',
    path: ['withdrawnReason'],
  });
export type CaseUpdateRequest = z.input<typeof caseUpdateSchema>;

/** `POST /api/cases/:id/sites`. */
export const siteCreateSchema = siteFieldsSchema;

/** `PATCH /api/sites/:id`: measurement edits; a reason is required once a value exists. */
export const siteUpdateSchema = z.object({
  referencePoint: z.enum(REFERENCE_POINTS).optional(),
  baselineRefGm: millimetres.optional(),
  probingDepth: millimetres.nullable().optional(),
  ktWidth: millimetres.nullable().optional(),
  marginToCrest: millimetres.nullable().optional(),
  papillaScore: papillaScore.nullable().optional(),
  plannedExcision: millimetres.nullable().optional(),
  postOpRefGm: millimetres.nullable().optional(),
  version,
  reason: changeReason.optional(),
});
export type SiteUpdateRequest = z.input<typeof siteUpdateSchema>;

const SORTABLE = ['surgeryDate', 'patientCode', 'operator', 'procedure', 'status', 'createdAt'] as const;

/** Query of `GET /api/cases`: paging, sorting and filters (all optional). */
export const caseListQuerySchema = z.object({
  page: z.coerce.number().int().min(0).default(0),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
  sort: z.enum(SORTABLE).default('surgeryDate'),
  direction: z.enum(['asc', 'desc']).default('desc'),
  operatorId: z.coerce.number().int().positive().optional(),
  procedure: z.enum(PROCEDURES).optional(),
  status: z.enum(CASE_STATUSES).optional(),
  phenotype: z.enum(['thin', 'thick']).optional(),
  from: isoDate.optional(),
  to: isoDate.optional(),
  tooth: fdiToothParam.optional(),
  patientCode: z.string().trim().max(20).optional(),
});
export type CaseListQuery = z.output<typeof caseListQuerySchema>;
