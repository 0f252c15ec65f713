import { SCHEDULE, standardFixture } from './testing/audit-fixture';
import { formatChange, formatObserved, formatP, formatTarget, standardParameters } from './standard-wording';

describe('standard wording', () => {
  it('states a target with its comparator and unit', () => {
    expect(formatTarget({ metric: 'mean-rebound', comparator: '<=', target: 1 })).toBe('≤ 1.0 mm');
    expect(formatTarget({ metric: 'recall-completion', comparator: '>=', target: 85 })).toBe('≥ 85.0%');
    expect(formatTarget({ metric: 'mean-papilla-change', comparator: '>=', target: -0.5 })).toBe('≥ −0.5 points');
  });

  it('names only the parameters the measure uses, with the interval’s own label', () => {
    expect(standardParameters(standardFixture({ metric: 'share-sites-rebound-within', intervalKey: '6m', thresholdMm: 1 }), SCHEDULE.intervals)).toEqual([
      'At 6 months',
      'Rebound ≤ 1.0 mm',
    ]);
    // A grade left over on a measure that does not use it is not shown.
    expect(standardParameters(standardFixture({ metric: 'recall-completion', intervalKey: '3m', minGrade: 'II' }), SCHEDULE.intervals)).toEqual(['At 3 months']);
    expect(standardParameters(standardFixture({ metric: 'share-cases-complication-grade', intervalKey: null, minGrade: 'IIIa' }), [])).toEqual([
      'Grade IIIa or worse',
    ]);
  });

  it('gives an observed share with its CI and count, and a mean with its n', () => {
    expect(formatObserved({ value: 81.82, ci95: [52.3, 94.86], n: 11, count: 9 }, '%')).toBe('81.8% (95% CI 52.3 to 94.9%; 9 of 11)');
    expect(formatObserved({ value: -0.04, ci95: [-0.31, 0.22], n: 20, count: null }, 'mm')).toBe('0.0 mm (95% CI −0.3 to 0.2 mm; n = 20)');
  });

  it('signs a change and its interval; shares change in percentage points', () => {
    expect(formatChange(-7.2, [-18.8, 2.7], '%')).toEqual({ change: '−7.2 pp', interval: '95% CI −18.8 to +2.7' });
    expect(formatChange(0.1, null, 'mm')).toEqual({ change: '+0.1 mm', interval: '' });
  });

  it('reports p to three places, or below 0.001', () => {
    expect(formatP(0.0342)).toBe('p = 0.034');
    expect(formatP(0.0004)).toBe('p < 0.001');
  });
});
