import type ExcelJS from 'exceljs';
import type { IntervalCompletion, ProportionEstimate, RecallCompletionSummary, RecallInterval } from '@tidemark/shared';
import { shareColumns } from './summary-columns';
import { startTableSheet, type TableColumn } from './table-sheet';

/** A row: an interval's completion, or the closing loss-to-follow-up line. */
type RecallRow = { kind: 'interval'; interval: IntervalCompletion; schedule: RecallInterval | null } | { kind: 'lost'; lost: ProportionEstimate };

const EMPTY: ProportionEstimate = { count: 0, n: 0, p: null, lower: null, upper: null };

function count(pick: (interval: IntervalCompletion) => number): (row: RecallRow) => number | null {
  return (row) => (row.kind === 'interval' ? pick(row.interval) : null);
}

/**
 * Recall completion per interval (withdrawn cases left out): due, seen in window, early, late,
 * missed, pending, not yet due, completion and in-window shares with Wilson CIs; the last row is
 * loss to follow-up (no visit at the last closed interval or later).
 */
export function writeRecallSheet(workbook: ExcelJS.stream.xlsx.WorkbookWriter, recall: RecallCompletionSummary, schedule: readonly RecallInterval[]): void {
  const columns: TableColumn<RecallRow>[] = [
    { header: 'Interval', width: 30, value: (row) => (row.kind === 'interval' ? row.interval.label : 'Lost to follow-up (any interval)') },
    { header: 'Due at day', width: 9, format: 'count', value: (row) => (row.kind === 'interval' ? (row.schedule?.targetDays ?? null) : null) },
    { header: 'Window, days', width: 12, value: (row) => (row.kind === 'interval' && row.schedule ? `−${row.schedule.windowBeforeDays} / +${row.schedule.windowAfterDays}` : '') },
    { header: 'Due (n)', width: 9, format: 'count', value: count((interval) => interval.due) },
    { header: 'Seen in window', width: 10, format: 'count', value: count((interval) => interval.seenInWindow) },
    { header: 'Seen early', width: 9, format: 'count', value: count((interval) => interval.seenEarly) },
    { header: 'Seen late', width: 9, format: 'count', value: count((interval) => interval.seenLate) },
    { header: 'Missed', width: 9, format: 'count', value: count((interval) => interval.missed) },
    { header: 'Window open, not seen', width: 11, format: 'count', value: count((interval) => interval.pending) },
    { header: 'Not yet due', width: 9, format: 'count', value: count((interval) => interval.notYetDue) },
    ...shareColumns<RecallRow>('Seen (of seen + missed)', (row) => (row.kind === 'interval' ? row.interval.completion : EMPTY)),
    ...shareColumns<RecallRow>('Seen in window', (row) => (row.kind === 'interval' ? row.interval.inWindow : EMPTY)),
    { header: 'Lost to follow-up (n)', width: 11, format: 'count', value: (row) => (row.kind === 'lost' ? row.lost.count : null) },
    { header: 'Cases with a closed window (n)', width: 12, format: 'count', value: (row) => (row.kind === 'lost' ? row.lost.n : null) },
    ...shareColumns<RecallRow>('Lost to follow-up', (row) => (row.kind === 'lost' ? row.lost : EMPTY)),
  ];
  const table = startTableSheet(workbook, 'Recall', columns, 1);
  for (const interval of recall.intervals) table.addRow({ kind: 'interval', interval, schedule: schedule.find((candidate) => candidate.key === interval.intervalKey) ?? null });
  table.addRow({ kind: 'lost', lost: recall.lossToFollowUp });
  table.commit();
}
