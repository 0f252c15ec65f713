/**
 * Thrown by every analytics function when its input cannot give a meaningful
 * result (empty sample, NaN, negative count, mismatched lengths, …).
 * The server maps it to a 400 response; the message is written for a person.
 */
export class AnalyticsInputError extends Error {
  override readonly name = 'AnalyticsInputError';
}
