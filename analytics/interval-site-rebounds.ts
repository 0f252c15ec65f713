import type { AuditDataset } from '../shared/types/audit-dataset';
import type { OutcomeRecord } from '../shared/types/outcome-record';
import { assertMillimetres } from './assert-millimetres';
import { findRecallInterval } from './find-recall-interval';
import { firstRecordPerSite } from './first-record-per-site';
import { rebound } from './rebound';

/** One site's rebound at an interval, with the row it came from. */
export interface SiteRebound {
  readonly record: OutcomeRecord;
  /** Post-op − recall REF→GM, mm. */
  readonly rebound: number;
}

/**
 * Rebound (DESIGN.md §3: REF→GM(post-op) − REF→GM(recall)) of every site measured at
 * one recall interval: rows with both readings, one per site ({@link firstRecordPerSite}).
 *
 * @param dataset the audit dataset (frame already validated)
 * @param intervalKey a key of dataset.schedule
 * @param label name of the calling function, used in the error message
 * @returns one { record, rebound } per site, in order of first appearance
 * @throws {AnalyticsInputError} on an unknown interval key or an implausible reading (outside 0–20 mm)
 */
export function intervalSiteRebounds(dataset: AuditDataset, intervalKey: string, label: string): SiteRebound[] {
  findRecallInterval(dataset.schedule, intervalKey, label);
  const measured = firstRecordPerSite(
    dataset.records,
    intervalKey,
    (record) => record.postOpRefGm !== null && record.recallRefGm !== null,
    label,
  );
  const sites: SiteRebound[] = [];
  for (const record of measured) {
    const { postOpRefGm, recallRefGm } = record;
    if (postOpRefGm === null || recallRefGm === null) continue;
    assertMillimetres(postOpRefGm, `${label}: site ${record.siteId} post-op REF→GM`);
    assertMillimetres(recallRefGm, `${label}: site ${record.siteId} recall REF→GM at '${intervalKey}'`);
    sites.push({ record, rebound: rebound(postOpRefGm, recallRefGm) });
  }
  return sites;
}
