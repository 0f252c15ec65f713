import { reportsLinkPath } from './reports-link';

describe('reportsLinkPath', () => {
  it('names the audit and the cycle, or "live" for live results', () => {
    expect(reportsLinkPath(7, 3)).toBe('/reports?audit=7&cycle=3');
    expect(reportsLinkPath(12, null)).toBe('/reports?audit=12&cycle=live');
  });
});
