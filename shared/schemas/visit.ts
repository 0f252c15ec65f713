import * as z from 'zod';
import { changeReason, millimetres, note, papillaScore, pastOrTodayDate, version, zeroToTen } from './clinical-fields';

/** One site's readings at a recall. */
export const siteMeasurementSchema = z.object({
  siteId: z.number().int().positive(),
  refGm: millimetres,
  probingDepth: millimetres.nullable().default(null),
  bleedingOnProbing: z.boolean().nullable().default(null),
  ktWidth: millimetres.nullable().default(null),
  papillaScore: papillaScore.nullable().default(null),
});
export type SiteMeasurementInput = z.input<typeof siteMeasurementSchema>;

const measurementsSchema = z
  .array(siteMeasurementSchema)
  .min(1, 'Enter at least one site.')
  .max(64)
  .refine((rows) => new Set(rows.map((row) => row.siteId)).size === rows.length, 'Each site may appear once.');

/** `POST /api/cases/:id/visits`: a recall with its measurements. */
export const visitCreateSchema = z.object({
  intervalKey: z.string().trim().min(1, 'Choose the recall interval.').max(20),
  visitDate: pastOrTodayDate,
  examinerId: z.number().int().positive().optional(),
  pain: zeroToTen.nullable().default(null),
  satisfaction: zeroToTen.nullable().default(null),
  notes: note().default(''),
  measurements: measurementsSchema,
  /** Set after the clinician confirmed a > 3 mm change (likely a reference-point error otherwise). */
  confirmLargeChange: z.boolean().default(false),
});
export type VisitCreateRequest = z.input<typeof visitCreateSchema>;
export type VisitCreate = z.output<typeof visitCreateSchema>;

/** A correction of one site's readings: only the fields sent change; the others stay as recorded. */
export const siteMeasurementPatchSchema = z.object({
  siteId: z.number().int().positive(),
  refGm: millimetres.optional(),
  probingDepth: millimetres.nullable().optional(),
  bleedingOnProbing: z.boolean().nullable().optional(),
  ktWidth: millimetres.nullable().optional(),
  papillaScore: papillaScore.nullable().optional(),
});

/** `PATCH /api/visits/:id`: edits after entry, always with a reason. */
export const visitUpdateSchema = z.object({
  visitDate: pastOrTodayDate.optional(),
  pain: zeroToTen.nullable().optional(),
  satisfaction: zeroToTen.nullable().optional(),
  notes: note().optional(),
  measurements: z
    .array(siteMeasurementPatchSchema)
    .min(1, 'Enter at least one site.')
    .max(64)
    .refine((rows) => new Set(rows.map((row) => row.siteId)).size === rows.length, 'Each site may appear once.')
    .optional(),
  confirmLargeChange: z.boolean().default(false),
  version,
  reason: changeReason,
});
export type VisitUpdateRequest = z.input<typeof visitUpdateSchema>;

/** `POST /api/calibration-readings`: one repeated REF→GM reading of a site for examiner calibration. */
export const calibrationReadingSchema = z.object({
  siteId: z.number().int().positive(),
  measuredOn: pastOrTodayDate,
  refGm: millimetres,
});
export type CalibrationReadingRequest = z.input<typeof calibrationReadingSchema>;
