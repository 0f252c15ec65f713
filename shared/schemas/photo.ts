import * as z from 'zod';
import { PHOTO_KINDS } from '../types/clinical-terms';
import { isoMonth } from './clinical-fields';
import { recordIdText } from './record-id';

/** Largest accepted photograph upload. */
export const PHOTO_MAX_BYTES = 15 * 1024 * 1024;
/** Largest accepted pixel count (a decompression-bomb guard): 60 megapixels. */
export const PHOTO_MAX_PIXELS = 60_000_000;

/** Form fields sent with a photograph upload (multipart, the file in field `file`). */
export const photoUploadSchema = z.object({
  kind: z.enum(PHOTO_KINDS, { message: 'Choose what the photograph shows.' }),
  visitId: recordIdText('Choose a visit of this case.').optional(),
  monthTaken: isoMonth.optional(),
});
export type PhotoUploadFields = z.input<typeof photoUploadSchema>;
