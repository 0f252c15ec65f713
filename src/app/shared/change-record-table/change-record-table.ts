import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import type { ChangeRecordView } from '@tidemark/shared';
import { fieldLabel, recordLabel, valueLabel } from './change-field-label';
import { LocalDatePipe } from '../../shared/dates/local-date-pipe';

/** A change record with its words worked out once, not on every check. */
interface ChangeRow {
  readonly record: ChangeRecordView;
  readonly what: string;
  readonly field: string;
  readonly oldValue: string;
  readonly newValue: string;
}

/**
 * The append-only change history as a table: who, when, what, old → new, and why.
 * Presentational: the page around it loads the records and pages through them.
 */
@Component({
  selector: 'tm-change-record-table',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [LocalDatePipe, MatIconModule, MatTableModule, RouterLink],
  templateUrl: './change-record-table.html',
  styleUrl: './change-record-table.scss',
})
export class ChangeRecordTable {
  /** Records to show, newest first as the API sends them. */
  readonly records = input.required<readonly ChangeRecordView[]>();
  /** Adds a column linking each record to its case (for the practice-wide history). */
  readonly showCase = input(false);
  /** Sentence shown when there are no records. */
  readonly emptyText = input('No changes have been recorded.');

  protected readonly rows = computed<ChangeRow[]>(() =>
    this.records().map((record) => ({
      record,
      what: recordLabel(record.entity),
      field: fieldLabel(record.field),
      oldValue: valueLabel(record.field, record.oldValue),
      newValue: valueLabel(record.field, record.newValue),
    })),
  );

  protected readonly columns = computed(() =>
    this.showCase()
      ? ['changedAt', 'changedBy', 'case', 'field', 'change', 'reason']
      : ['changedAt', 'changedBy', 'field', 'change', 'reason'],
  );
}
