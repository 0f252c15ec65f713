import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { intervalSiteRebounds } from './interval-site-rebounds';
import { SMALL_AUDIT, auditCase, siteRecord } from './small-audit-dataset.fixture';

describe('intervalSiteRebounds', () => {
  it('gives post-op − recall per site measured at the interval (fixture table, 6 weeks)', () => {
    // 111: 10 − 10.5 = −0.5; 112: 9.5 − 9 = 0.5; 211: 11 − 11 = 0; 212: 10.5 − 9 = 1.5.
    const sites = intervalSiteRebounds(SMALL_AUDIT, '6w', 'test');
    expect(sites.map((site) => [site.record.siteId, site.rebound])).toEqual([[111, -0.5], [112, 0.5], [211, 0], [212, 1.5]]);
  });

  it('leaves out papilla rows without REF→GM (6 months: 6 of the 10 rows)', () => {
    expect(intervalSiteRebounds(SMALL_AUDIT, '6m', 'test')).toHaveLength(6);
  });

  it('rejects an unknown interval and an implausible reading', () => {
    expect(() => intervalSiteRebounds(SMALL_AUDIT, '9m', 'test')).toThrow(AnalyticsInputError);
    const owner = auditCase({ caseId: 1, patientId: 1, operatorId: 1, surgeryDate: '2024-01-01', procedure: 'gingivectomy', phenotype: 'thin', smoking: 'never' });
    const bad = { ...SMALL_AUDIT, records: [siteRecord(owner, { siteId: 5, intervalKey: '6m', visitDate: '2024-07-01', baselineRefGm: 8, postOpRefGm: 25, recallRefGm: 9 })] };
    expect(() => intervalSiteRebounds(bad, '6m', 'test')).toThrow(/site 5 post-op REF→GM must lie between 0 and 20 mm/);
  });
});
