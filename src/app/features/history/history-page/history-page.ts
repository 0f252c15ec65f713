import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule, PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { ActivatedRoute, ParamMap, Params, Router, RouterLink } from '@angular/router';
import type { ChangeRecordView } from '@tidemark/shared';
import { BehaviorSubject, catchError, combineLatest, debounceTime, distinctUntilChanged, map, of, switchMap, tap } from 'rxjs';
import { ChangeRecordTable } from '../../../shared/change-record-table/change-record-table';
import { type ChangeHistoryQuery, HistoryApi } from '../history-api';

/** Page sizes offered under the table; the first is the default. */
export const HISTORY_PAGE_SIZES = [25, 50, 100] as const;

/** Reads page, page size and case from the address; anything unreadable falls back to the default. */
export function readHistoryQuery(params: ParamMap): ChangeHistoryQuery {
  const page = wholeNumber(params.get('page'));
  const pageSize = wholeNumber(params.get('pageSize'));
  const caseId = wholeNumber(params.get('caseId'));
  return {
    page: page ?? 0,
    pageSize: pageSize && pageSize <= 200 && pageSize > 0 ? pageSize : HISTORY_PAGE_SIZES[0],
    ...(caseId && caseId > 0 ? { caseId } : {}),
  };
}

/** The address's query parameters for a history query, defaults left out. */
export function historyQueryParams(query: ChangeHistoryQuery): Params {
  return {
    ...(query.caseId !== undefined ? { caseId: query.caseId } : {}),
    ...(query.page > 0 ? { page: query.page } : {}),
    ...(query.pageSize !== HISTORY_PAGE_SIZES[0] ? { pageSize: query.pageSize } : {}),
  };
}

function wholeNumber(text: string | null): number | null {
  return text !== null && /^\d{1,9}$/.test(text) ? Number(text) : null;
}

/** Change history: every change to clinical records, paged on the server, optionally for one case. */
@Component({
  selector: 'tm-history-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ChangeRecordTable,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatProgressBarModule,
    ReactiveFormsModule,
    RouterLink,
  ],
  templateUrl: './history-page.html',
  styleUrl: './history-page.scss',
})
export class HistoryPage {
  private readonly api = inject(HistoryApi);
  private readonly router = inject(Router);
  private readonly route = inject(ActivatedRoute);

  protected readonly pageSizes = HISTORY_PAGE_SIZES;
  protected readonly query = toSignal(this.route.queryParamMap.pipe(map(readHistoryQuery)), { requireSync: true });
  protected readonly records = signal<ChangeRecordView[]>([]);
  protected readonly total = signal(0);
  protected readonly isLoading = signal(true);
  protected readonly hasLoadFailed = signal(false);
  protected readonly emptyText = computed(() => {
    if (this.isLoading()) return 'Loading the change history…';
    if (this.hasLoadFailed()) return 'The change history could not be loaded.';
    const caseId = this.query().caseId;
    return caseId === undefined ? 'No changes have been recorded yet.' : `No changes are recorded for case ${caseId}.`;
  });

  /** Case number typed in the filter; whole positive numbers only. */
  protected readonly caseFilter = new FormControl(this.query().caseId?.toString() ?? '', {
    nonNullable: true,
    validators: Validators.pattern(/^\s*\d{1,9}\s*$/),
  });
  private readonly reloads = new BehaviorSubject<void>(undefined);

  constructor() {
    const queries = this.route.queryParamMap.pipe(
      map(readHistoryQuery),
      distinctUntilChanged((a, b) => a.page === b.page && a.pageSize === b.pageSize && a.caseId === b.caseId),
    );
    combineLatest([queries, this.reloads])
      .pipe(
        tap(([query]) => {
          this.isLoading.set(true);
          this.hasLoadFailed.set(false);
          const shown = query.caseId?.toString() ?? '';
          if (this.caseFilter.value.trim() !== shown) this.caseFilter.setValue(shown, { emitEvent: false });
        }),
        switchMap(([query]) => this.api.list(query).pipe(catchError(() => of(null)))),
        takeUntilDestroyed(),
      )
      .subscribe((page) => {
        this.isLoading.set(false);
        if (page) {
          this.records.set(page.items);
          this.total.set(page.total);
        } else {
          // The error notice has said why; the page offers a retry.
          this.records.set([]);
          this.hasLoadFailed.set(true);
        }
      });

    this.caseFilter.valueChanges.pipe(debounceTime(400), takeUntilDestroyed()).subscribe(() => this.applyCaseFilter());
  }

  protected applyCaseFilter(): void {
    if (this.caseFilter.invalid) return;
    const text = this.caseFilter.value.trim();
    const caseId = text === '' ? undefined : Number(text);
    if (caseId !== this.query().caseId) {
      this.navigate({ page: 0, pageSize: this.query().pageSize, ...(caseId ? { caseId } : {}) });
    }
  }

  protected clearCaseFilter(): void {
    this.caseFilter.setValue('', { emitEvent: false });
    this.navigate({ page: 0, pageSize: this.query().pageSize });
  }

  protected changePage(event: PageEvent): void {
    const query = this.query();
    this.navigate({ ...query, page: event.pageSize === query.pageSize ? event.pageIndex : 0, pageSize: event.pageSize });
  }

  protected reload(): void {
    this.reloads.next();
  }

  private navigate(query: ChangeHistoryQuery): void {
    void this.router.navigate([], { relativeTo: this.route, queryParams: historyQueryParams(query) });
  }
}
