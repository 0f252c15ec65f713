import { describe, expect, it } from 'vitest';
import type { CaseOutcome } from '../shared/types/outcome-record';
import { DEFAULT_RECALL_SCHEDULE } from '../shared/types/recall-schedule';
import { AnalyticsInputError } from './analytics-input-error';
import { summariseRecallCompletion } from './summarise-recall-completion';

/*
 * Invented test cases (not demo data), worked by hand as of 2024-09-01 with the default schedule
 * (windows in days after surgery: 2w 11–21, 6w 35–56, 3m 77–112, 6m 161–212, 12m 335–425).
 * 101 surgery 2024-01-10 (asOf = day 235): 2w none → missed; 6w 02-21 = day 42 → in window;
 *     3m none → missed; 6m 07-20 = day 192 → in window; 12m not yet due. Last closed 6m, seen → kept.
 * 102 surgery 2024-03-01 (asOf = day 184): 2w 03-12 = day 11 → in window (boundary);
 *     6w 04-30 = day 60 → late; 3m 05-10 = day 70 → early; 6m 08-20 = day 172 → in window;
 *     12m not yet due. Last closed 3m, seen → kept.
 * 103 surgery 2023-12-01 (asOf = day 275): 2w 12-15 = day 14 → in window; 6w, 3m, 6m missed;
 *     12m not yet due. Last closed 6m, nothing since → lost to follow-up.
 * 104 withdrawn → excluded, counted separately.
 * 105 surgery 2024-08-25 (asOf = day 7): every interval not yet due; not evaluable for loss.
 * 106 surgery 2024-02-20 (asOf = day 194): 2w day 14, 6w day 42, 3m day 91 → in window;
 *     6m window open, no visit → pending; 12m not yet due. Last closed 3m, seen → kept.
 * Totals: 2w: in 3, missed 1, not due 1 → due 4. 6w: in 2, late 1, missed 1. 3m: in 1, early 1,
 * missed 2. 6m: in 2, missed 1, pending 1, not due 1. 12m: not due 5. Loss: 1 of 4 evaluable.
 */
function caseOutcome(caseId: number, surgeryDate: string, visits: [string, string][], isWithdrawn = false): CaseOutcome {
  return {
    caseId,
    patientId: caseId,
    operatorId: 1,
    surgeryDate,
    isWithdrawn,
    complications: [],
    visits: visits.map(([intervalKey, visitDate]) => ({ intervalKey, visitDate })),
  };
}

const CASES: CaseOutcome[] = [
  caseOutcome(101, '2024-01-10', [['6w', '2024-02-21'], ['6m', '2024-07-20']]),
  caseOutcome(102, '2024-03-01', [['2w', '2024-03-12'], ['6w', '2024-04-30'], ['3m', '2024-05-10'], ['6m', '2024-08-20']]),
  caseOutcome(103, '2023-12-01', [['2w', '2023-12-15']]),
  caseOutcome(104, '2024-01-01', [], true),
  caseOutcome(105, '2024-08-25', []),
  caseOutcome(106, '2024-02-20', [['2w', '2024-03-05'], ['6w', '2024-04-02'], ['3m', '2024-05-21'], ['unscheduled', '2024-06-01']]),
];

describe('summariseRecallCompletion', () => {
  const summary = summariseRecallCompletion(CASES, DEFAULT_RECALL_SCHEDULE, '2024-09-01');

  it('counts cases and withdrawals', () => {
    expect(summary).toMatchObject({ asOf: '2024-09-01', nCases: 6, nWithdrawn: 1 });
  });

  it('classifies every interval (hand calculation above)', () => {
    const rows = summary.intervals.map(({ intervalKey, due, seenInWindow, seenEarly, seenLate, missed, pending, notYetDue }) => ({
      intervalKey, due, seenInWindow, seenEarly, seenLate, missed, pending, notYetDue,
    }));
    expect(rows).toEqual([
      { intervalKey: '2w', due: 4, seenInWindow: 3, seenEarly: 0, seenLate: 0, missed: 1, pending: 0, notYetDue: 1 },
      { intervalKey: '6w', due: 4, seenInWindow: 2, seenEarly: 0, seenLate: 1, missed: 1, pending: 0, notYetDue: 1 },
      { intervalKey: '3m', due: 4, seenInWindow: 1, seenEarly: 1, seenLate: 0, missed: 2, pending: 0, notYetDue: 1 },
      { intervalKey: '6m', due: 4, seenInWindow: 2, seenEarly: 0, seenLate: 0, missed: 1, pending: 1, notYetDue: 1 },
      { intervalKey: '12m', due: 0, seenInWindow: 0, seenEarly: 0, seenLate: 0, missed: 0, pending: 0, notYetDue: 5 },
    ]);
  });

  it('completion = seen / (seen + missed), pending left out; in-window share alongside', () => {
    const [twoWeeks, , threeMonths, sixMonths, twelveMonths] = summary.intervals;
    expect(twoWeeks.completion).toMatchObject({ count: 3, n: 4, p: 0.75 });
    expect(threeMonths.inWindow).toMatchObject({ count: 1, n: 4 });
    expect(sixMonths.completion).toMatchObject({ count: 2, n: 3 });
    expect(twelveMonths.completion).toEqual({ count: 0, n: 0, p: null, lower: null, upper: null });
  });

  it('loss to follow-up: 1 of 4 evaluable cases', () => {
    expect(summary.lossToFollowUp).toMatchObject({ count: 1, n: 4, p: 0.25 });
  });

  it('throws on a duplicated case, a bad date or a bad schedule', () => {
    expect(() => summariseRecallCompletion([CASES[0], CASES[0]], DEFAULT_RECALL_SCHEDULE, '2024-09-01')).toThrow(/appears twice/);
    expect(() => summariseRecallCompletion(CASES, DEFAULT_RECALL_SCHEDULE, '01/09/2024')).toThrow(/asOf must be an ISO date/);
    expect(() => summariseRecallCompletion([caseOutcome(1, '2024-02-30', [])], DEFAULT_RECALL_SCHEDULE, '2024-09-01')).toThrow(
      AnalyticsInputError,
    );
    expect(() => summariseRecallCompletion(CASES, [], '2024-09-01')).toThrow(/at least one interval/);
    const badVisit = [caseOutcome(7, '2024-01-10', [['6w', '2024-02-31']])];
    expect(() => summariseRecallCompletion(badVisit, DEFAULT_RECALL_SCHEDULE, '2024-09-01')).toThrow(
      /cases\[0\] \(case 7\): visitDate must be an ISO date YYYY-MM-DD, got 2024-02-31/,
    );
  });
});
