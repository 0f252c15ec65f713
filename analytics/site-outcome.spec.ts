import { siteOutcome } from './site-outcome';

// Conventions: DESIGN.md §3 (rebound = post-op − recall; retained = recall − baseline;
// % retained = retained / gain × 100; stable ≤ 0.5 mm, relapse > 1.0 mm). Values computed by hand.
describe('siteOutcome', () => {
  it('computes rebound, retained gain, % retained and the class for a typical site', () => {
    // gain 10 − 8 = 2; rebound 10 − 9.5 = 0.5; retained 9.5 − 8 = 1.5; 1.5 / 2 = 75 %.
    expect(siteOutcome({ baselineRefGm: 8, postOpRefGm: 10, recallRefGm: 9.5 })).toEqual({
      rebound: 0.5,
      retainedGain: 1.5,
      percentRetained: 75,
      stability: 'stable',
      isFlaggedForReview: false,
    });
  });

  it('classes 1.0 mm rebound as minor and 1.5 mm as relapse', () => {
    expect(siteOutcome({ baselineRefGm: 8, postOpRefGm: 11, recallRefGm: 10 }).stability).toBe('minor');
    expect(siteOutcome({ baselineRefGm: 8, postOpRefGm: 11, recallRefGm: 9.5 }).stability).toBe('relapse');
  });

  it('flags a negative rebound for review and still counts it as stable', () => {
    const outcome = siteOutcome({ baselineRefGm: 8, postOpRefGm: 10, recallRefGm: 10.5 });
    expect(outcome.rebound).toBe(-0.5);
    expect(outcome.stability).toBe('stable');
    expect(outcome.isFlaggedForReview).toBe(true);
  });

  it('gives only the retained gain without a post-op reading, and null % when the gain is 0', () => {
    expect(siteOutcome({ baselineRefGm: 8, postOpRefGm: null, recallRefGm: 9 })).toEqual({
      rebound: null,
      retainedGain: 1,
      percentRetained: null,
      stability: null,
      isFlaggedForReview: false,
    });
    expect(siteOutcome({ baselineRefGm: 8, postOpRefGm: 8, recallRefGm: 8 }).percentRetained).toBeNull();
  });

  it('uses audit-specific thresholds', () => {
    expect(siteOutcome({ baselineRefGm: 8, postOpRefGm: 10, recallRefGm: 9.5 }, { stable: 0.25, relapse: 0.75 }).stability).toBe('minor');
  });

  it('rejects implausible readings', () => {
    expect(() => siteOutcome({ baselineRefGm: 8, postOpRefGm: 10, recallRefGm: 25 })).toThrow();
  });
});
