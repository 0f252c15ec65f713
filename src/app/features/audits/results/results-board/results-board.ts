import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { ActivatedRoute, Router } from '@angular/router';
import type { CycleView, OperatorView } from '@tidemark/shared';
import { map } from 'rxjs';
import { AuthSession } from '../../../../core/auth/auth-session';
import { ColorScheme } from '../../../../core/theme/color-scheme';
import { ClinicalCaution } from '../../../../shared/clinical-caution/clinical-caution';
import { chartPalette } from '../chart-kit/chart-palette';
import { cohortLabel } from '../cohort-label';
import { countsLine } from '../chart-kit/result-format';
import { ExaminerAgreement } from '../examiner-agreement/examiner-agreement';
import { ResultsApi } from '../results-api';
import { ResultsCharts } from '../results-charts/results-charts';
import { ResultsFilters } from '../results-filters/results-filters';
import { operatorChoices } from '../operator-choices';
import { isSameKey, loadOnChange } from '../results-load';
import { readResultsQuery, resolveInterval, resultsQueryParams, type ResultsQuery } from '../results-query';
import { ResultsSummaryTable } from '../results-summary-table/results-summary-table';
import { LocalDatePipe } from '../../../../shared/dates/local-date-pipe';

/**
 * The Results area of an audit: scope, narrowing and filter chips kept in the address
 * (`?groupBy=&interval=&measure=&cycle=&phenotype=&operator=`), every chart and table following them together.
 * Charts (and Chart.js) load in a deferred block of their own.
 */
@Component({
  selector: 'tm-results-board',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ClinicalCaution,
    LocalDatePipe,
    ExaminerAgreement,
    MatButtonModule,
    MatIconModule,
    MatProgressBarModule,
    ResultsCharts,
    ResultsFilters,
    ResultsSummaryTable,
  ],
  templateUrl: './results-board.html',
  styleUrl: './results-board.scss',
})
export class ResultsBoard {
  private readonly api = inject(ResultsApi);
  private readonly router = inject(Router);
  private readonly route = inject(ActivatedRoute);
  private readonly scheme = inject(ColorScheme);
  private readonly viewer = inject(AuthSession).user;

  /** The audit whose results are shown. */
  readonly auditId = input.required<number>();
  /** The audit's cycles, for the live / cycle switch. */
  readonly cycles = input<readonly CycleView[]>([]);
  /** The practice's operators (loaded by the audit page for the roles that see names). */
  readonly operators = input<readonly OperatorView[]>([]);

  /** The view as the address states it. */
  protected readonly query = toSignal(this.route.queryParamMap.pipe(map(readResultsQuery)), { requireSync: true });
  private readonly reloads = signal(0);

  /** The cycle in force: the address's, when the audit has it (trusted until the cycles are known). */
  protected readonly cycleId = computed(() => {
    const wanted = this.query().cycle;
    const cycles = this.cycles();
    return wanted !== null && (cycles.length === 0 || cycles.some((cycle) => cycle.id === wanted)) ? wanted : null;
  });

  /** Operators this viewer may narrow the results to. */
  protected readonly operatorChoices = computed(() => operatorChoices(this.viewer(), this.operators()));
  /** The operator in force: the address's, when this viewer may choose it (trusted until the operators are known). */
  protected readonly operatorId = computed(() => {
    const wanted = this.query().operator;
    const choices = this.operatorChoices();
    const isWaitingForOperators = this.operators().length === 0 && (this.viewer()?.role === 'audit_lead' || this.viewer()?.role === 'partner');
    return wanted !== null && (isWaitingForOperators || choices.some((choice) => choice.id === wanted)) ? wanted : null;
  });
  /** The narrowing every view but the funnel follows. */
  private readonly narrowing = computed(() => ({ phenotype: this.query().phenotype, operatorId: this.operatorId() }), { equal: isSameKey });

  private readonly resultsKey = computed(() => ({ auditId: this.auditId(), cycleId: this.cycleId(), groupBy: this.query().groupBy, ...this.narrowing(), reload: this.reloads() }), {
    equal: isSameKey,
  });
  protected readonly results = loadOnChange(this.resultsKey, (key) => this.api.results(key.auditId, key));

  /** Results of the scope in force only: a stale answer from another scope must not choose the interval. */
  private readonly currentResults = computed(() => {
    const results = this.results().value;
    return results && results.cycleId === this.cycleId() ? results : null;
  });
  /** The interval in force: the address's when scheduled, else the server's default. */
  protected readonly intervalKey = computed(() => resolveInterval(this.query().interval, this.currentResults()?.schedule ?? this.results().value?.schedule ?? []));

  private readonly intervalScopeKey = computed(
    () => {
      const interval = this.currentResults() ? this.intervalKey() : null;
      return interval === null ? null : { auditId: this.auditId(), cycleId: this.cycleId(), intervalKey: interval, ...this.narrowing(), reload: this.reloads() };
    },
    { equal: isSameKey },
  );
  private readonly funnelKey = computed(
    () => {
      const scope = this.intervalScopeKey();
      // The funnel compares every operator: only the phenotype narrows it.
      return scope === null ? null : { ...scope, operatorId: null, measure: this.query().measure };
    },
    { equal: isSameKey },
  );
  private readonly scopeKey = computed(() => ({ auditId: this.auditId(), cycleId: this.cycleId(), ...this.narrowing(), reload: this.reloads() }), { equal: isSameKey });

  protected readonly funnel = loadOnChange(this.funnelKey, (key) => this.api.funnel(key.auditId, key));
  protected readonly trend = loadOnChange(this.intervalScopeKey, (key) => this.api.trend(key.auditId, key));
  protected readonly survival = loadOnChange(this.scopeKey, (key) => this.api.survival(key.auditId, key));
  protected readonly calibration = loadOnChange(this.scopeKey, (key) => this.api.calibration(key.auditId, key));

  protected readonly palette = computed(() => chartPalette(this.scheme.isDark()));
  /** The cohort the charts and the summary table show, in the narrowing filters' wording ("All cases" when not narrowed). */
  protected readonly cohortLabel = computed(() => cohortLabel(this.query().phenotype, this.operatorId(), this.operatorChoices()));
  protected readonly isBusy = computed(() => [this.results(), this.funnel(), this.trend(), this.survival(), this.calibration()].some((loaded) => loaded.status === 'loading'));
  protected readonly cohortLine = computed(() => {
    const results = this.results().value;
    return results ? countsLine({ sites: results.cohort.sites, patients: results.cohort.patients, cases: results.cohort.cases }) : '';
  });
  protected readonly calibrationPending = computed(() => this.calibration().failure ?? 'Loading…');

  /** Writes a change of view to the address, leaving every other parameter (such as `area`) as it is. */
  protected choose(change: Partial<ResultsQuery>): void {
    void this.router.navigate([], { relativeTo: this.route, queryParams: resultsQueryParams(change), queryParamsHandling: 'merge' });
  }

  protected reload(): void {
    this.reloads.update((count) => count + 1);
  }
}
