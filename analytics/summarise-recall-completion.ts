import type { CaseOutcome, IntervalCompletion, RecallCompletionSummary, RecallInterval } from '../shared/types/outcome-record';
import { AnalyticsInputError } from './analytics-input-error';
import { assertRecallSchedule } from './assert-recall-schedule';
import { isoDateToDayNumber } from './iso-date-to-day-number';
import { proportionEstimate } from './proportion-estimate';
import { assertArray } from './assert-array';

/** Running counts for one interval. */
interface CompletionCounts {
  seenInWindow: number;
  seenEarly: number;
  seenLate: number;
  missed: number;
  pending: number;
  notYetDue: number;
}

/**
 * Recall completion per interval and loss to follow-up, as of a date (all days
 * counted from the surgery date; windows inclusive at both ends):
 * window = [surgery + target − before, surgery + target + after].
 * For each case that is not withdrawn and each interval:
 * - seen in window / seen early / seen late: first visit at that interval falls
 *   inside / before / after the window (a case with a visit is always due);
 * - missed: no visit and asOf is past the window; pending: no visit, window open;
 * - not yet due: no visit and the window has not opened;
 * - due = everything except not yet due.
 * Completion = seen / (seen + missed) and in-window = seen in window / (seen + missed),
 * with Wilson 95% intervals; pending cases are left out until their window closes.
 * Loss to follow-up: a case whose last interval with a closed window (by target day)
 * has no visit at it or at any later interval; the denominator is the cases with
 * at least one closed window. Withdrawn cases are excluded and counted separately.
 * Definitions: common practice for recall audits (DESIGN.md §1, §4).
 *
 * @param cases case-level outcomes (visits with interval keys not in the schedule are ignored)
 * @param schedule recall intervals
 * @param asOf ISO date of the audit
 * @returns { asOf, nCases, nWithdrawn, intervals, lossToFollowUp }
 * @throws {AnalyticsInputError} on a malformed schedule, an invalid date or a duplicated case id
 */
export function summariseRecallCompletion(
  cases: readonly CaseOutcome[],
  schedule: readonly RecallInterval[],
  asOf: string,
): RecallCompletionSummary {
  assertRecallSchedule(schedule);
  const today = isoDateToDayNumber(asOf, 'asOf');
  assertArray(cases, 'summariseRecallCompletion: cases');
  const intervalIndex = new Map(schedule.map((interval, k) => [interval.key, k]));
  // Position of each interval in time, for "this interval or any later one".
  const byTarget = schedule.map((_, k) => k).sort((x, y) => schedule[x].targetDays - schedule[y].targetDays);
  const counts: CompletionCounts[] = schedule.map(() => ({
    seenInWindow: 0, seenEarly: 0, seenLate: 0, missed: 0, pending: 0, notYetDue: 0,
  }));
  const caseIds = new Set<number>();
  let nWithdrawn = 0;
  let lost = 0;
  let evaluable = 0;
  const visitDays = new Float64Array(schedule.length);

  cases.forEach((outcome, i) => {
    if (caseIds.has(outcome.caseId)) {
      throw new AnalyticsInputError(`summariseRecallCompletion: case ${outcome.caseId} appears twice`);
    }
    caseIds.add(outcome.caseId);
    let surgeryDay: number;
    visitDays.fill(Number.NaN);
    // Dates are checked without building a per-visit label (this runs for every visit
    // of every case); on failure the error is re-thrown naming the case.
    try {
      surgeryDay = isoDateToDayNumber(outcome.surgeryDate, 'surgeryDate');
      if (outcome.isWithdrawn) {
        nWithdrawn++;
        return;
      }
      assertArray(outcome.visits, 'visits');
      for (const { intervalKey, visitDate } of outcome.visits) {
        const k = intervalIndex.get(intervalKey);
        const day = isoDateToDayNumber(visitDate, 'visitDate');
        // The first visit for an interval is the one that counts.
        if (k !== undefined && !(day >= visitDays[k])) visitDays[k] = day;
      }
    } catch (error) {
      if (error instanceof AnalyticsInputError) {
        throw new AnalyticsInputError(`summariseRecallCompletion: cases[${i}] (case ${outcome.caseId}): ${error.message}`);
      }
      throw error;
    }

    let lastClosed = -1;
    for (let position = 0; position < byTarget.length; position++) {
      const k = byTarget[position];
      const { targetDays, windowBeforeDays, windowAfterDays } = schedule[k];
      const opens = surgeryDay + targetDays - windowBeforeDays;
      const closes = surgeryDay + targetDays + windowAfterDays;
      const visitDay = visitDays[k];
      const tally = counts[k];
      if (!Number.isNaN(visitDay)) {
        if (visitDay < opens) tally.seenEarly++;
        else if (visitDay <= closes) tally.seenInWindow++;
        else tally.seenLate++;
      } else if (today < opens) tally.notYetDue++;
      else if (today > closes) tally.missed++;
      else tally.pending++;
      if (today > closes) lastClosed = position;
    }
    if (lastClosed >= 0) {
      evaluable++;
      let isSeenSince = false;
      for (let position = lastClosed; position < byTarget.length && !isSeenSince; position++) {
        isSeenSince = !Number.isNaN(visitDays[byTarget[position]]);
      }
      if (!isSeenSince) lost++;
    }
  });

  const intervals: IntervalCompletion[] = schedule.map((interval, k) => {
    const tally = counts[k];
    const seen = tally.seenInWindow + tally.seenEarly + tally.seenLate;
    return {
      intervalKey: interval.key,
      label: interval.label,
      due: seen + tally.missed + tally.pending,
      ...tally,
      completion: proportionEstimate(seen, seen + tally.missed),
      inWindow: proportionEstimate(tally.seenInWindow, seen + tally.missed),
    };
  });
  return { asOf, nCases: cases.length, nWithdrawn, intervals, lossToFollowUp: proportionEstimate(lost, evaluable) };
}
