import * as z from 'zod';
import { PHENOTYPES } from '../types/clinical-terms';

/**
 * Query parameters that narrow an audit's results to part of its cohort, so a partner can read,
 * say, one operator's thin-phenotype cases on every chart at once. Both are optional; together
 * they combine (thin **and** that operator).
 */
export const resultsNarrowingSchema = z.object({
  phenotype: z.enum(PHENOTYPES, { message: 'Choose thin or thick.' }).optional().describe('Only cases whose patient has this gingival phenotype'),
  operatorId: z.coerce
    .number({ message: 'Choose an operator from the list.' })
    .int('Choose an operator from the list.')
    .positive('Choose an operator from the list.')
    .optional()
    .describe('Only cases of this operator (user id)'),
});
export type ResultsNarrowing = z.infer<typeof resultsNarrowingSchema>;
