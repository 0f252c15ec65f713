import { z } from 'zod';
import { parseOrThrow } from '../middleware/validate';

const idSchema = z.object({ id: z.coerce.number().int('Not a valid id.').positive('Not a valid id.').max(2 ** 31, 'Not a valid id.') });

/** The numeric `:id` of a route, or a 400. */
export function routeId(params: Record<string, string | string[]>): number {
  return parseOrThrow(idSchema, params).id;
}
