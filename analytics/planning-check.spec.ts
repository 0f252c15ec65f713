import { planningCheck } from './planning-check';

describe('planningCheck', () => {
  // Source: Lang NP, Löe H, J Periodontol 1972;43:623–627 — 2 mm keratinized tissue is adequate.
  it('warns when less than 2 mm of keratinized tissue would remain', () => {
    expect(planningCheck({ ktWidth: 3, marginToCrest: null, plannedExcision: 1.5 })).toEqual([
      { kind: 'keratinized-tissue', remaining: 1.5, threshold: 2 },
    ]);
    expect(planningCheck({ ktWidth: 4, marginToCrest: null, plannedExcision: 2 })).toEqual([]);
  });

  // Source: common practice ("3 mm rule" from the new margin to the bone crest; discussed by Arora et al., J Periodontol 2013;84:934–940).
  it('warns when the new margin would sit closer than 3 mm to the crest', () => {
    expect(planningCheck({ ktWidth: null, marginToCrest: 4, plannedExcision: 2 })).toEqual([
      { kind: 'crest-distance', remaining: 2, threshold: 3 },
    ]);
    expect(planningCheck({ ktWidth: null, marginToCrest: 5, plannedExcision: 2 })).toEqual([]);
  });

  it('reports both warnings together and skips checks without inputs', () => {
    expect(planningCheck({ ktWidth: 2.5, marginToCrest: 3, plannedExcision: 1 }).map((warning) => warning.kind)).toEqual([
      'keratinized-tissue',
      'crest-distance',
    ]);
    expect(planningCheck({ ktWidth: 1, marginToCrest: 1, plannedExcision: null })).toEqual([]);
  });

  it('rejects implausible readings', () => {
    expect(() => planningCheck({ ktWidth: -1, marginToCrest: null, plannedExcision: 1 })).toThrow(/millimetres|between/);
    expect(() => planningCheck({ ktWidth: 3, marginToCrest: null, plannedExcision: Number.NaN })).toThrow();
  });
});
