import { calibrationResult } from '../testing/results-fixtures';
import { agreementFacts, targetVerdict } from './examiner-agreement';

describe('examiner agreement', () => {
  it('states pairs, agreement within ±1 mm, κ with its band, ICC and Bland–Altman', () => {
    expect(agreementFacts(calibrationResult())).toEqual([
      { term: 'Paired readings', value: '20' },
      { term: 'Within ±1 mm', value: '95.0% (85.0 to 100.0%)' },
      { term: 'Weighted κ (linear)', value: '0.72, substantial' },
      { term: 'ICC (2,1), absolute agreement', value: '0.91' },
      { term: 'Bland–Altman bias', value: '0.05 mm' },
      { term: '95% limits of agreement', value: '−0.73 to 0.83 mm' },
    ]);
  });

  it('says whether the target is met in words and an icon, not colour alone', () => {
    expect(targetVerdict(calibrationResult())).toEqual({ icon: 'verified', text: 'Calibration target met', tone: 'met' });
    expect(targetVerdict(calibrationResult({ meetsCalibrationTarget: false })).text).toBe('Calibration target not met');
    expect(targetVerdict(calibrationResult({ meetsCalibrationTarget: null, kappa: null })).icon).toBe('help');
  });

  it('shows dashes where a statistic could not be computed', () => {
    const facts = agreementFacts(calibrationResult({ pairs: 1, kappa: null, icc: null, blandAltman: null }));
    expect(facts.slice(2).map((fact) => fact.value)).toEqual(['—', '—', '—', '—']);
  });
});
