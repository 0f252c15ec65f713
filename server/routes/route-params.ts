import { z } from 'zod';
import { recordIdText } from '@tidemark/shared';
import { parseOrThrow } from '../middleware/validate';

// Canonical decimal only (see recordIdText).
const idSchema = z.object({ id: recordIdText('Not a valid id.') });

/** The numeric `:id` of a route (digits only, no sign, no leading zero), or a 400. */
export function routeId(params: Record<string, string | string[]>): number {
  return parseOrThrow(idSchema, params).id;
}
