import { NARROWED_COHORT_LABEL, WHOLE_COHORT_LABEL, cohortLabel } from './cohort-label';

// Expected words are the results filters' own (PHENOTYPE_LABELS in shared/types/clinical-terms.ts, operator choice labels).
const CHOICES = [
  { id: 5, label: 'Wren Adeyemi' },
  { id: 7, label: 'Tobias Lind (you)' },
];

describe('cohortLabel', () => {
  it('names the whole cohort when nothing narrows it', () => {
    expect(cohortLabel(null, null, CHOICES)).toBe(WHOLE_COHORT_LABEL);
    expect(WHOLE_COHORT_LABEL).toBe('All cases');
  });

  it('names the phenotype, the operator, or both, in the filters’ wording', () => {
    expect(cohortLabel('thin', null, CHOICES)).toBe('Thin (≤ 1 mm)');
    expect(cohortLabel(null, 5, CHOICES)).toBe('Wren Adeyemi');
    expect(cohortLabel('thick', 7, CHOICES)).toBe('Thick (> 1 mm) · Tobias Lind (you)');
  });

  it('says the cohort is narrowed while the operator’s name is not known', () => {
    expect(cohortLabel('thin', 9, CHOICES)).toBe(NARROWED_COHORT_LABEL);
    expect(cohortLabel(null, 9, [])).toBe('Narrowed cohort');
  });
});
