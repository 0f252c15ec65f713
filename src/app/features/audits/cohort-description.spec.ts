import type { CohortDefinition } from '@tidemark/shared';
import { cohortSentence, describeCohort } from './cohort-description';

const ANY: CohortDefinition = {
  surgeryFrom: null,
  surgeryTo: null,
  procedures: [],
  operatorIds: [],
  phenotypes: [],
  indications: [],
  smoking: [],
  diabetes: [],
  regions: [],
  teeth: [],
};

describe('describeCohort', () => {
  const names = { names: new Map([[5, 'Wren Adeyemi']]) };

  it('says "every case" when no filter is in use', () => {
    expect(describeCohort(ANY, names, 'en-GB')).toEqual([]);
    expect(cohortSentence([])).toBe('Every case in the practice');
  });

  it('puts each filter in words, in a fixed order, teeth sorted', () => {
    const clauses = describeCohort(
      { ...ANY, surgeryFrom: '2025-01-01', surgeryTo: '2025-06-30', indications: ['aesthetic'], regions: ['maxillary-anterior'], teeth: [21, 11], operatorIds: [5] },
      names,
      'en-GB',
    );
    expect(cohortSentence(clauses)).toBe(
      'Surgery dates: 1 Jan 2025 to 30 Jun 2025 · Operators: Wren Adeyemi · Indication: Excess gingival display / altered passive eruption · Region: Upper front (canine to canine) · Teeth (FDI): 11, 21',
    );
  });

  it('gives an open-ended range one side', () => {
    expect(describeCohort({ ...ANY, surgeryTo: '2025-06-30' }, names, 'en-GB')).toEqual([{ dimension: 'Surgery dates', words: 'until 30 Jun 2025' }]);
  });

  it('only counts operators for readers who may not see names, telling a clinician when they are in it', () => {
    const cohort = { ...ANY, operatorIds: [5, 41] };
    expect(describeCohort(cohort, { selfId: null }, 'en-GB')).toEqual([{ dimension: 'Operators', words: '2 operators' }]);
    expect(describeCohort(cohort, { selfId: 41 }, 'en-GB')).toEqual([{ dimension: 'Operators', words: '2 operators, including you' }]);
  });
});
