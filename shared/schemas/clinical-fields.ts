import * as z from 'zod';
import { isValidFdiTooth } from '../../analytics/is-valid-fdi-tooth';

/** Largest plausible distance in mm (DESIGN.md §3). */
export const MAX_MM = 20;
/** Change of REF→GM between consecutive visits that needs a confirmation (DESIGN.md §3). */
export const LARGE_CHANGE_MM = 3;

/** A probe reading in mm: 0–20 in 0.5 mm steps (probes are read to 0.5–1 mm; common practice). */
export const millimetres = z
  .number({ message: 'Enter millimetres.' })
  .min(0, 'Must be 0 mm or more.')
  .max(MAX_MM, `Must be ${MAX_MM} mm or less.`)
  .refine((value) => Number.isInteger(value * 2), 'Use 0.5 mm steps.');

/** A calendar date `YYYY-MM-DD` that exists. */
export const isoDate = z
  .string({ message: 'Enter a date.' })
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use the form YYYY-MM-DD.')
  .refine((value) => {
    const date = new Date(`${value}T00:00:00Z`);
    return !Number.isNaN(date.getTime()) && date.toISOString().slice(0, 10) === value;
  }, 'This date does not exist.');

/** Today's date `YYYY-MM-DD` in UTC (the server's notion of "not in the future"). */
export function todayIso(now: Date = new Date()): string {
  return now.toISOString().slice(0, 10);
}

/** A date that is not after today. */
export const pastOrTodayDate = isoDate.refine((value) => value <= todayIso(), 'Cannot be in the future.');

/** A month `YYYY-MM`. */
export const isoMonth = z.string().regex(/^\d{4}-(0[1-9]|1[0-2])$/, 'Use the form YYYY-MM.');

const FDI_MESSAGE = 'Not an FDI tooth number (ISO 3950: 11–18, 21–28, 31–38, 41–48, 51–55 … 81–85).';

/** FDI two-digit tooth number, ISO 3950 (permanent and primary), as a JSON number. */
export const fdiTooth = z.number({ message: 'Enter an FDI tooth number.' }).refine((value) => isValidFdiTooth(value), FDI_MESSAGE);

/** The same in a query string: exactly two digits, e.g. `?tooth=11`. */
export const fdiToothParam = z
  .string()
  .refine((value) => isValidFdiTooth(value), FDI_MESSAGE)
  .transform(Number);

/** Jemt papilla index 0–4. */
export const papillaScore = z.number().int('Use a whole score.').min(0, 'Score 0–4.').max(4, 'Score 0–4.');

/** A 0–10 patient-reported scale. */
export const zeroToTen = z.number().int('Use a whole number.').min(0, 'Use 0–10.').max(10, 'Use 0–10.');

/** Optimistic-lock version sent back with every change. */
export const version = z.number().int().min(1);

/** Why a recorded value is changed (required for edits after first entry). */
export const changeReason = z.string().trim().min(3, 'Say why the value changes (at least 3 characters).').max(500);

/** Free text with a sane cap. */
export const note = (max = 2000) => z.string().trim().max(max);
