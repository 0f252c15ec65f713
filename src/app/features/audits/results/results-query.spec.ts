import { convertToParamMap } from '@angular/router';
import type { RecallInterval } from '@tidemark/shared';
import { DEFAULT_RESULTS_QUERY, isSameResultsQuery, readResultsQuery, resolveInterval, resultsQueryParams } from './results-query';

function interval(key: string, targetDays: number): RecallInterval {
  return { key, label: key, targetDays, windowBeforeDays: 7, windowAfterDays: 7 };
}

describe('results query', () => {
  it('reads every parameter it owns from the address', () => {
    const query = readResultsQuery(convertToParamMap({ groupBy: 'operator', interval: '12m', measure: 'relapse', cycle: '2', phenotype: 'thin', operator: '9', area: 'results' }));
    expect(query).toEqual({ groupBy: 'operator', interval: '12m', measure: 'relapse', cycle: 2, phenotype: 'thin', operator: 9 });
  });

  it('drops only the values that make no sense', () => {
    const query = readResultsQuery(convertToParamMap({ groupBy: 'postcode', interval: '6m', measure: 'mood', cycle: '-4', phenotype: 'medium', operator: 'Dr X' }));
    expect(query).toEqual({ ...DEFAULT_RESULTS_QUERY, interval: '6m' });
    expect(readResultsQuery(convertToParamMap({ interval: 'x'.repeat(21), cycle: '1.5', operator: '0' }))).toEqual(DEFAULT_RESULTS_QUERY);
  });

  it('turns defaults into nulls so merging removes them from the address', () => {
    expect(resultsQueryParams({ groupBy: null, measure: 'complication', cycle: null })).toEqual({ groupBy: null, measure: null, cycle: null });
    expect(resultsQueryParams({ groupBy: 'smoking', measure: 'relapse', cycle: 4, interval: '3m' })).toEqual({
      groupBy: 'smoking',
      measure: 'relapse',
      cycle: 4,
      interval: '3m',
    });
    expect(resultsQueryParams({ phenotype: 'thick', operator: 5 })).toEqual({ phenotype: 'thick', operator: 5 });
    expect(resultsQueryParams({ phenotype: null, operator: null })).toEqual({ phenotype: null, operator: null });
    // Only what changed is written: other parameters stay as they are.
    expect(Object.keys(resultsQueryParams({ interval: '6w' }))).toEqual(['interval']);
  });

  it('compares views parameter by parameter', () => {
    expect(isSameResultsQuery(DEFAULT_RESULTS_QUERY, { ...DEFAULT_RESULTS_QUERY })).toBe(true);
    expect(isSameResultsQuery(DEFAULT_RESULTS_QUERY, { ...DEFAULT_RESULTS_QUERY, cycle: 1 })).toBe(false);
  });

  it('falls back to the server’s default interval when the asked one is not scheduled', () => {
    const schedule = [interval('2w', 14), interval('6m', 182), interval('12m', 365)];
    expect(resolveInterval('12m', schedule)).toBe('12m');
    expect(resolveInterval('9m', schedule)).toBe('6m');
    expect(resolveInterval(null, [interval('2w', 14), interval('3m', 91)])).toBe('3m');
    expect(resolveInterval('6m', [])).toBeNull();
  });
});
