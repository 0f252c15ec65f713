import * as z from 'zod';

/**
 * A record id sent as text (a route parameter, a multipart field): canonical decimal only,
 * 1 to 2^31. `z.coerce.number()` alone would read `0x1`, `+1`, `1e0`, ` 1` and `01` as record 1.
 * @param message the error for anything else, in the words of the field
 */
export function recordIdText(message: string) {
  return z
    .string()
    .regex(/^[1-9]\d{0,9}$/, message)
    .transform(Number)
    .pipe(z.number().max(2 ** 31, message));
}
