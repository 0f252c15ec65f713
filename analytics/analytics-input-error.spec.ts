import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';

describe('AnalyticsInputError', () => {
  it('is an Error with its own name, so the server can map it to a 400', () => {
    const error = new AnalyticsInputError('describe: values needs at least 1 value, got 0');
    expect(error).toBeInstanceOf(Error);
    expect(error.name).toBe('AnalyticsInputError');
    expect(error.message).toMatch(/at least 1 value/);
  });
});
