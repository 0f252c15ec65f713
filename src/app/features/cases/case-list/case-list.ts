import { ChangeDetectionStrategy, Component, LOCALE_ID, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatChipsModule } from '@angular/material/chips';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule, PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSortModule, Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { ActivatedRoute, Router, RouterLink } from '@angular/router';
import {
  CASE_STATUSES,
  CASE_STATUS_LABELS,
  PHENOTYPES,
  PHENOTYPE_LABELS,
  PROCEDURES,
  PROCEDURE_LABELS,
  caseListQuerySchema,
  type CaseListItem,
  type CaseListQuery,
  type CaseStatus,
  type OperatorView,
  type Phenotype,
  type Procedure,
} from '@tidemark/shared';
import { BehaviorSubject, catchError, combineLatest, debounceTime, distinctUntilChanged, map, merge, of, switchMap, tap } from 'rxjs';
import { AuthSession } from '../../../core/auth/auth-session';
import { CaseStatusBadge } from '../../../shared/case-status-badge/case-status-badge';
import { fieldMessage, zodValidator } from '../../../shared/forms/zod-validator';
import { CasesApi } from '../cases-api';
import { type FilterChip, filterChips } from './case-filter-chips';
import { CASE_PAGE_SIZES, type CaseListFilters, caseListQueryParams, isSameCaseListQuery, readCaseListQuery } from './case-list-query';
import { LocalDatePipe } from '../../../shared/dates/local-date-pipe';

/** The filter form's controls; empty means "any". */
interface CaseFilterForm {
  patientCode: FormControl<string>;
  operatorId: FormControl<number | null>;
  procedure: FormControl<Procedure | null>;
  status: FormControl<CaseStatus | null>;
  phenotype: FormControl<Phenotype | null>;
  tooth: FormControl<string>;
  from: FormControl<string>;
  to: FormControl<string>;
}

/** Typing settles for this long before the list asks the server again. */
const TYPING_PAUSE_MS = 400;

/** Cases: a server-side paged, sorted and filtered table whose whole state lives in the address. */
@Component({
  selector: 'tm-case-list',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    CaseStatusBadge,
    LocalDatePipe,
    MatButtonModule,
    MatChipsModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatSelectModule,
    MatSortModule,
    MatTableModule,
    ReactiveFormsModule,
    RouterLink,
  ],
  templateUrl: './case-list.html',
  styleUrl: './case-list.scss',
})
export class CaseList {
  private readonly api = inject(CasesApi);
  private readonly router = inject(Router);
  private readonly route = inject(ActivatedRoute);
  private readonly locale = inject(LOCALE_ID);
  private readonly user = inject(AuthSession).user;

  protected readonly procedures = PROCEDURES;
  protected readonly procedureLabels = PROCEDURE_LABELS;
  protected readonly statuses = CASE_STATUSES;
  protected readonly statusLabels = CASE_STATUS_LABELS;
  protected readonly phenotypes = PHENOTYPES;
  protected readonly phenotypeLabels = PHENOTYPE_LABELS;
  protected readonly pageSizes = CASE_PAGE_SIZES;
  protected readonly fieldMessage = fieldMessage;

  /** Clinicians see only their own cases, so operator filter and column would say nothing. */
  protected readonly isOwnCasesOnly = computed(() => this.user()?.role === 'clinician');
  protected readonly canRegister = computed(() => {
    const role = this.user()?.role;
    return role === 'audit_lead' || role === 'clinician';
  });
  protected readonly columns = computed(() =>
    this.isOwnCasesOnly()
      ? ['patientCode', 'surgeryDate', 'procedure', 'teeth', 'status', 'visits']
      : ['patientCode', 'surgeryDate', 'operator', 'procedure', 'teeth', 'status', 'visits'],
  );

  protected readonly filters = new FormGroup<CaseFilterForm>({
    patientCode: new FormControl('', { nonNullable: true }),
    operatorId: new FormControl<number | null>(null),
    procedure: new FormControl<Procedure | null>(null),
    status: new FormControl<CaseStatus | null>(null),
    phenotype: new FormControl<Phenotype | null>(null),
    tooth: new FormControl('', { nonNullable: true, validators: optional(zodValidator(caseListQuerySchema.shape.tooth)) }),
    from: new FormControl('', { nonNullable: true }),
    to: new FormControl('', { nonNullable: true }),
  });

  /** The list's state as read from the address. */
  protected readonly query = toSignal(this.route.queryParamMap.pipe(map(readCaseListQuery)), { requireSync: true });
  protected readonly items = signal<CaseListItem[]>([]);
  protected readonly total = signal(0);
  protected readonly isLoading = signal(true);
  protected readonly hasLoadFailed = signal(false);
  protected readonly operators = signal<OperatorView[]>([]);
  /** Whether the less-used filters are open; starts open when one of them is in use. */
  protected readonly isMoreOpen = signal(false);
  private readonly reloads = new BehaviorSubject<void>(undefined);

  protected readonly chips = computed(() => filterChips(this.query(), this.operators(), this.locale));
  /** Active filters hidden behind "More filters", counted on its button. */
  protected readonly hiddenFilterCount = computed(() => {
    const query = this.query();
    return [query.procedure, query.phenotype, query.tooth, query.from, query.to].filter((value) => value !== undefined).length;
  });

  constructor() {
    this.isMoreOpen.set(this.hiddenFilterCount() > 0);
    if (!this.isOwnCasesOnly()) {
      this.api
        .operators()
        .pipe(takeUntilDestroyed())
        .subscribe({ next: (operators) => this.operators.set(operators), error: () => this.operators.set([]) });
    }

    combineLatest([this.route.queryParamMap.pipe(map(readCaseListQuery), distinctUntilChanged(isSameCaseListQuery)), this.reloads])
      .pipe(
        tap(([query]) => {
          this.showFiltersOf(query);
          this.isLoading.set(true);
          this.hasLoadFailed.set(false);
        }),
        // A newer query cancels the answer to an older one, so the table never shows stale rows.
        switchMap(([query]) => this.api.list(query).pipe(catchError(() => of(null)))),
        takeUntilDestroyed(),
      )
      .subscribe((page) => {
        this.isLoading.set(false);
        if (page) {
          this.items.set(page.items);
          this.total.set(page.total);
        } else {
          // The error notice has said why; the table offers a retry.
          this.hasLoadFailed.set(true);
        }
      });

    const controls = this.filters.controls;
    merge(
      controls.patientCode.valueChanges.pipe(debounceTime(TYPING_PAUSE_MS)),
      controls.tooth.valueChanges.pipe(debounceTime(TYPING_PAUSE_MS)),
      controls.operatorId.valueChanges,
      controls.procedure.valueChanges,
      controls.status.valueChanges,
      controls.phenotype.valueChanges,
      controls.from.valueChanges,
      controls.to.valueChanges,
    )
      .pipe(takeUntilDestroyed())
      .subscribe(() => this.applyFilters());
  }

  protected procedureLabel(procedure: Procedure): string {
    return PROCEDURE_LABELS[procedure];
  }

  protected toggleMoreFilters(): void {
    this.isMoreOpen.update((open) => !open);
  }

  protected sortBy(sort: Sort): void {
    const column = caseListQuerySchema.shape.sort.safeParse(sort.active);
    if (column.success) {
      this.navigate({ ...this.query(), sort: column.data, direction: sort.direction === 'asc' ? 'asc' : 'desc', page: 0 });
    }
  }

  protected changePage(event: PageEvent): void {
    const query = this.query();
    // A new page size starts again at the first page: the old index would point elsewhere.
    const page = event.pageSize === query.pageSize ? event.pageIndex : 0;
    this.navigate({ ...query, page, pageSize: event.pageSize });
  }

  protected clearFilter(name: FilterChip['name']): void {
    this.navigate({ ...this.query(), [name]: undefined, page: 0 });
  }

  protected clearAllFilters(): void {
    const query = this.query();
    this.navigate({ page: 0, pageSize: query.pageSize, sort: query.sort, direction: query.direction });
  }

  protected goToFirstPage(): void {
    this.navigate({ ...this.query(), page: 0 });
  }

  protected reload(): void {
    this.reloads.next();
  }

  protected openCase(item: CaseListItem): void {
    void this.router.navigate(['/cases', item.id]);
  }

  /** Puts the form's filters into the address (page back to the first). */
  private applyFilters(): void {
    const value = this.filters.getRawValue();
    const tooth = this.filters.controls.tooth.valid ? caseListQuerySchema.shape.tooth.safeParse(value.tooth || undefined) : null;
    const filters: CaseListFilters = {
      patientCode: value.patientCode.trim() || undefined,
      operatorId: value.operatorId ?? undefined,
      procedure: value.procedure ?? undefined,
      status: value.status ?? undefined,
      phenotype: value.phenotype ?? undefined,
      // An unfinished tooth number keeps the filter that was there until it is valid.
      tooth: tooth?.success ? tooth.data : this.query().tooth,
      from: value.from || undefined,
      to: value.to || undefined,
    };
    const query = this.query();
    const next: CaseListQuery = { ...filters, page: 0, pageSize: query.pageSize, sort: query.sort, direction: query.direction };
    if (!isSameCaseListQuery(next, query)) {
      this.navigate(next);
    }
  }

  private navigate(query: CaseListQuery): void {
    void this.router.navigate([], { relativeTo: this.route, queryParams: caseListQueryParams(query) });
  }

  /** Shows the address's filters in the form without echoing them back as changes. */
  private showFiltersOf(query: CaseListQuery): void {
    const controls = this.filters.controls;
    const shown: { [K in keyof CaseFilterForm]: CaseFilterForm[K]['value'] } = {
      patientCode: query.patientCode ?? '',
      operatorId: query.operatorId ?? null,
      procedure: query.procedure ?? null,
      status: query.status ?? null,
      phenotype: query.phenotype ?? null,
      tooth: query.tooth === undefined ? '' : String(query.tooth),
      from: query.from ?? '',
      to: query.to ?? '',
    };
    // Leave a field alone while it already means the same, so typing is never interrupted.
    if (controls.patientCode.value.trim() !== shown.patientCode) controls.patientCode.setValue(shown.patientCode, { emitEvent: false });
    if (controls.tooth.value.trim() !== shown.tooth && controls.tooth.valid) controls.tooth.setValue(shown.tooth, { emitEvent: false });
    controls.operatorId.setValue(shown.operatorId, { emitEvent: false });
    controls.procedure.setValue(shown.procedure, { emitEvent: false });
    controls.status.setValue(shown.status, { emitEvent: false });
    controls.phenotype.setValue(shown.phenotype, { emitEvent: false });
    controls.from.setValue(shown.from, { emitEvent: false });
    controls.to.setValue(shown.to, { emitEvent: false });
  }
}

/** Runs `validator` only when the field has something in it. */
function optional(validator: ReturnType<typeof zodValidator>): ReturnType<typeof zodValidator> {
  return (control) => (control.value === '' || control.value === null ? null : validator(control));
}
