import * as z from 'zod';
import { CLAVIEN_DINDO_GRADES, COMPLICATION_TYPES } from '../types/clinical-terms';
import { changeReason, note, pastOrTodayDate, version } from './clinical-fields';

const complicationFields = {
  visitId: z.number().int().positive().nullable().default(null),
  type: z.enum(COMPLICATION_TYPES, { message: 'Choose a type.' }),
  grade: z.enum(CLAVIEN_DINDO_GRADES, { message: 'Choose a Clavien–Dindo grade.' }),
  onsetDate: pastOrTodayDate,
  resolutionDate: pastOrTodayDate.nullable().default(null),
  management: note(1000).default(''),
};

/** `POST /api/cases/:id/complications`. */
export const complicationCreateSchema = z
  .object(complicationFields)
  .refine((body) => body.resolutionDate === null || body.resolutionDate >= body.onsetDate, {
    message: 'Resolution cannot come before onset.',
    path: ['resolutionDate'],
  });
export type ComplicationCreateRequest = z.input<typeof complicationCreateSchema>;

/** `PATCH /api/complications/:id`. */
export const complicationUpdateSchema = z.object({
  type: complicationFields.type.optional(),
  grade: complicationFields.grade.optional(),
  onsetDate: pastOrTodayDate.optional(),
  resolutionDate: pastOrTodayDate.nullable().optional(),
  management: note(1000).optional(),
  version,
  reason: changeReason,
});
export type ComplicationUpdateRequest = z.input<typeof complicationUpdateSchema>;
