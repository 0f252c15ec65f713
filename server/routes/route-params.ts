import { z } from 'zod';
import { parseOrThrow } from '../middleware/validate';

// Canonical decimal only: `z.coerce.number()` alone read `0x1`, `+1`, `1e0`, ` 1` and `01` as record 1.
const idSchema = z.object({
  id: z
    .string()
    .regex(/^[1-9]\d{0,9}$/, 'Not a valid id.')
    .transform(Number)
    .pipe(z.number().max(2 ** 31, 'Not a valid id.')),
});

/** The numeric `:id` of a route (digits only, no sign, no leading zero), or a 400. */
export function routeId(params: Record<string, string | string[]>): number {
  return parseOrThrow(idSchema, params).id;
}
