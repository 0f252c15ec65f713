import { DEFAULT_RECALL_SCHEDULE, type RecallInterval, type VisitView } from '@tidemark/shared';

/** Where one interval of a case's schedule stands. */
export type TimelineState = 'recorded' | 'open' | 'closed' | 'later';

/** One interval of the recall schedule for one case. */
export interface TimelineStep {
  readonly interval: RecallInterval;
  readonly targetDate: string;
  readonly windowOpens: string;
  readonly windowCloses: string;
  /** The recall recorded for this interval, if any. */
  readonly visit: VisitView | null;
  readonly state: TimelineState;
}

const DAY_MS = 86_400_000;

/** `date` + `days`, as YYYY-MM-DD in calendar (UTC) arithmetic, as the server counts windows. */
export function addDays(date: string, days: number): string {
  return new Date(Date.parse(`${date}T00:00:00Z`) + days * DAY_MS).toISOString().slice(0, 10);
}

/**
 * Lays the case's recalls over the schedule: each interval with its window, the visit
 * recorded for it (if any) and where it stands on `today`. Dates only; no outcome is
 * computed here.
 */
export function recallTimeline(
  surgeryDate: string,
  visits: readonly VisitView[],
  today: string,
  schedule: readonly RecallInterval[] = DEFAULT_RECALL_SCHEDULE,
): TimelineStep[] {
  return schedule.map((interval) => {
    const targetDate = addDays(surgeryDate, interval.targetDays);
    const windowOpens = addDays(targetDate, -interval.windowBeforeDays);
    const windowCloses = addDays(targetDate, interval.windowAfterDays);
    const visit = visits.find((candidate) => candidate.intervalKey === interval.key) ?? null;
    const state: TimelineState = visit ? 'recorded' : today > windowCloses ? 'closed' : today >= windowOpens ? 'open' : 'later';
    return { interval, targetDate, windowOpens, windowCloses, visit, state };
  });
}

/** Visits recorded under a key the schedule does not know (kept visible, never dropped). */
export function unscheduledVisits(visits: readonly VisitView[], schedule: readonly RecallInterval[] = DEFAULT_RECALL_SCHEDULE): VisitView[] {
  return visits.filter((visit) => !schedule.some((interval) => interval.key === visit.intervalKey));
}
