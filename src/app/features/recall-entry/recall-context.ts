import { DEFAULT_RECALL_SCHEDULE, LARGE_CHANGE_MM, SITE_LOCATIONS, type CaseDetail, type RecallInterval, type SiteView } from '@tidemark/shared';

const DAY_MS = 86_400_000;

/** `date` + `days` as YYYY-MM-DD, in UTC calendar days as the server counts them. */
export function addDays(date: string, days: number): string {
  return new Date(Date.parse(`${date}T00:00:00Z`) + days * DAY_MS).toISOString().slice(0, 10);
}

/** Whole days from `from` to `to` (negative when `to` is earlier). */
export function daysBetween(from: string, to: string): number {
  return Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / DAY_MS);
}

/** The target date and tolerance window of one interval for one surgery date. */
export interface RecallWindow {
  targetDate: string;
  opens: string;
  closes: string;
}

/** Where a visit date falls against the window. */
export type WindowTiming = { kind: 'in-window' } | { kind: 'early' | 'late'; days: number };

/** The interval of the default schedule (DESIGN.md §1.3) with this key, or null. */
export function scheduleInterval(key: string): RecallInterval | null {
  return DEFAULT_RECALL_SCHEDULE.find((interval) => interval.key === key) ?? null;
}

/** Target = surgery + targetDays; the window opens and closes around it. */
export function recallWindow(surgeryDate: string, interval: RecallInterval): RecallWindow {
  const targetDate = addDays(surgeryDate, interval.targetDays);
  return {
    targetDate,
    opens: addDays(targetDate, -interval.windowBeforeDays),
    closes: addDays(targetDate, interval.windowAfterDays),
  };
}

/** Whether a visit date lies in the window, or how many days early or late it is. */
export function windowTiming(window: RecallWindow, visitDate: string): WindowTiming {
  if (visitDate < window.opens) {
    return { kind: 'early', days: daysBetween(visitDate, window.opens) };
  }
  if (visitDate > window.closes) {
    return { kind: 'late', days: daysBetween(window.closes, visitDate) };
  }
  return { kind: 'in-window' };
}

/** The reading a new REF→GM is compared with for the large-change check. */
export interface PreviousReading {
  refGm: number;
  /** Where it comes from, e.g. "6 weeks recall" or "post-op". */
  source: string;
}

/**
 * The previous REF→GM of each site, as the server judges it (visit.service): the latest
 * visit dated before `visitDate` that measured the site (the visit being corrected excluded),
 * else the post-op reading; none when neither exists.
 */
export function previousReadings(detail: Pick<CaseDetail, 'sites' | 'visits'>, visitDate: string, excludeVisitId: number | null): Map<number, PreviousReading> {
  const earlier = detail.visits
    .filter((visit) => visit.id !== excludeVisitId && visit.visitDate < visitDate)
    .sort((a, b) => b.visitDate.localeCompare(a.visitDate));
  const readings = new Map<number, PreviousReading>();
  for (const site of detail.sites) {
    const latest = earlier
      .map((visit) => ({ visit, measurement: visit.measurements.find((each) => each.siteId === site.id) }))
      .find((entry) => entry.measurement !== undefined);
    if (latest?.measurement) {
      readings.set(site.id, { refGm: latest.measurement.refGm, source: `${latest.visit.intervalLabel} recall` });
    } else if (site.postOpRefGm !== null) {
      readings.set(site.id, { refGm: site.postOpRefGm, source: 'post-op' });
    }
  }
  return readings;
}

/** More than 3 mm from the previous reading (DESIGN.md §3): usually a different reference point. */
export function isLargeChange(refGm: number, previous: PreviousReading | null): boolean {
  return previous !== null && Math.abs(refGm - previous.refGm) > LARGE_CHANGE_MM;
}

/** Sites in the order the grid shows them: FDI number, then mid-facial, mesial, distal. */
export function gridOrder(sites: readonly SiteView[]): SiteView[] {
  const rank = (site: SiteView) => site.tooth * 10 + SITE_LOCATIONS.indexOf(site.location);
  return [...sites].sort((a, b) => rank(a) - rank(b));
}
