import { auditFixture } from './testing/report-fixtures';
import { resolveReportsLink } from './report-link';

const AUDITS = [auditFixture({ id: 12 }), auditFixture({ id: 13, cycles: [] })];

describe('resolveReportsLink', () => {
  it('finds the linked audit and cycle', () => {
    expect(resolveReportsLink(AUDITS, '12', '72')).toEqual({ kind: 'found', auditId: 12, scope: 72 });
  });

  it('reads "live" or no cycle as live results', () => {
    expect(resolveReportsLink(AUDITS, '13', 'live')).toEqual({ kind: 'found', auditId: 13, scope: 'live' });
    expect(resolveReportsLink(AUDITS, '12', undefined)).toEqual({ kind: 'found', auditId: 12, scope: 'live' });
  });

  it('says "missing" for an audit or cycle that is not there, and "none" without a link', () => {
    expect(resolveReportsLink(AUDITS, '99', '72')).toEqual({ kind: 'missing' });
    expect(resolveReportsLink(AUDITS, '13', '72')).toEqual({ kind: 'missing' });
    expect(resolveReportsLink(AUDITS, undefined, '72')).toEqual({ kind: 'none' });
    expect(resolveReportsLink(AUDITS, '', undefined)).toEqual({ kind: 'none' });
  });
});
