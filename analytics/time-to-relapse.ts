import type { AuditDataset } from '../shared/types/audit-dataset';
import type { SurvivalResult } from '../shared/types/audit-results';
import { AnalyticsInputError } from './analytics-input-error';
import { assertAuditDataset } from './assert-audit-dataset';
import { assertMillimetres } from './assert-millimetres';
import { isoDateToDayNumber } from './iso-date-to-day-number';
import { kaplanMeier } from './kaplan-meier';
import { rebound } from './rebound';
import { stabilityClass } from './stability-class';

/** One site's follow-up while it is being read. */
interface SiteFollowUp {
  surgeryDay: number;
  visits: { day: number; isRelapse: boolean }[];
}

/**
 * Time to relapse per site (DESIGN.md §4), as a Kaplan–Meier curve ({@link kaplanMeier};
 * Kaplan & Meier, JASA 1958): for each site, the recall visits with both post-op and
 * recall REF→GM, whatever their interval key, in date order. Event: the first visit
 * whose rebound (post-op − recall) exceeds thresholds.relapse ({@link stabilityClass}
 * 'relapse'), at its days since surgery. Otherwise the site is censored at its last such
 * visit. Sites with no measured recall are left out. Times in days.
 *
 * @param dataset the audit dataset
 * @returns { relapseThresholdMm, nSites, events, censored, curve }
 * @throws {AnalyticsInputError} on an invalid date or reading, or a visit dated before surgery
 * @example
 * timeToRelapse(dataset).curve.steps[0]; // { time: 42, atRisk: 6, events: 1, survival: 0.8333, … }
 */
export function timeToRelapse(dataset: AuditDataset): SurvivalResult {
  assertAuditDataset(dataset, 'timeToRelapse');
  const sites = new Map<number, SiteFollowUp>();
  dataset.records.forEach((record, i) => {
    if (record === null || typeof record !== 'object') throw new AnalyticsInputError(`timeToRelapse: records[${i}] must be a record object`);
    const { postOpRefGm, recallRefGm } = record;
    if (postOpRefGm === null || recallRefGm === null) return;
    assertMillimetres(postOpRefGm, `timeToRelapse: records[${i}].postOpRefGm`);
    assertMillimetres(recallRefGm, `timeToRelapse: records[${i}].recallRefGm`);
    const surgeryDay = isoDateToDayNumber(record.surgeryDate, `timeToRelapse: records[${i}].surgeryDate`);
    const day = isoDateToDayNumber(record.visitDate, `timeToRelapse: records[${i}].visitDate`);
    if (day < surgeryDay) {
      throw new AnalyticsInputError(`timeToRelapse: records[${i}] (site ${record.siteId}) is dated ${record.visitDate}, before its surgery on ${record.surgeryDate}`);
    }
    const site = sites.get(record.siteId) ?? { surgeryDay, visits: [] };
    site.visits.push({ day, isRelapse: stabilityClass(rebound(postOpRefGm, recallRefGm), dataset.thresholds) === 'relapse' });
    sites.set(record.siteId, site);
  });

  const times: number[] = [];
  const events: boolean[] = [];
  for (const { surgeryDay, visits } of sites.values()) {
    visits.sort((a, b) => a.day - b.day);
    const relapse = visits.find((visit) => visit.isRelapse);
    times.push((relapse ?? visits[visits.length - 1]).day - surgeryDay);
    events.push(relapse !== undefined);
  }
  const eventCount = events.filter(Boolean).length;
  return {
    relapseThresholdMm: dataset.thresholds.relapse,
    nSites: times.length,
    events: eventCount,
    censored: times.length - eventCount,
    curve: times.length > 0 ? kaplanMeier(times, events) : { n: 0, steps: [], median: null },
  };
}
