import { fieldLabel, valueLabel } from './change-field-label';

describe('change history labels', () => {
  it('names stored fields in the trade’s words', () => {
    expect(fieldLabel('postOpRefGm')).toBe('Post-op REF→GM');
    expect(fieldLabel('ktWidth')).toBe('Keratinized tissue width');
  });

  it('labels every millimetre reading with its unit (DESIGN.md §3: readings are in millimetres)', () => {
    for (const field of ['refGm', 'baselineRefGm', 'postOpRefGm', 'probingDepth', 'ktWidth', 'marginToCrest', 'plannedExcision', 'deepestProbingMm']) {
      expect(valueLabel(field, '2.5')).toBe('2.5 mm');
    }
  });

  it('leaves unit-less values as they are and shows a cleared value as "empty"', () => {
    expect(valueLabel('papillaScore', '3')).toBe('3');
    expect(valueLabel('bleedingScorePct', '12')).toBe('12%');
    expect(valueLabel('refGm', null)).toBe('empty');
    expect(valueLabel('status', 'in-recall')).toBe('In recall');
  });
});
