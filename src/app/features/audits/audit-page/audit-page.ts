import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, input, numberAttribute, signal } from '@angular/core';
import { takeUntilDestroyed, toObservable } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTabsModule } from '@angular/material/tabs';
import { Title } from '@angular/platform-browser';
import { ActivatedRoute, Router, RouterLink } from '@angular/router';
import type { AuditResults, AuditView, OperatorView } from '@tidemark/shared';
import { BehaviorSubject, catchError, combineLatest, map, of, switchMap, tap } from 'rxjs';
import { AuthSession } from '../../../core/auth/auth-session';
import { describeHttpError } from '../../../core/http/describe-http-error';
import { ClinicalCaution } from '../../../shared/clinical-caution/clinical-caution';
import { AuditsApi } from '../audits-api';
import { CycleStageBadge } from '../badges/cycle-stage-badge';
import { CriteriaTable } from '../criteria/criteria-table';
import { CycleComparison } from '../cycle-comparison/cycle-comparison';
import { CyclesPanel } from '../cycles/cycles-panel';
import { ResultsBoard } from '../results/results-board/results-board';
import { ReviewNotes } from '../review-notes/review-notes';
import { ScopeEditor } from '../scope/scope-editor';
import { ScopeSummary } from '../scope/scope-summary';
import { AUDIT_AREAS, areaIndex } from './audit-areas';

type AuditLoad = { readonly audit: AuditView } | { readonly failure: string };

/** One audit in four areas — Scope, Criteria, Results, Cycles & actions — with the area kept in the address. */
@Component({
  selector: 'tm-audit-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ClinicalCaution,
    CriteriaTable,
    CycleComparison,
    CycleStageBadge,
    CyclesPanel,
    MatButtonModule,
    MatIconModule,
    MatProgressBarModule,
    MatTabsModule,
    ResultsBoard,
    ReviewNotes,
    RouterLink,
    ScopeEditor,
    ScopeSummary,
  ],
  templateUrl: './audit-page.html',
  styleUrl: './audit-page.scss',
})
export class AuditPage {
  private readonly api = inject(AuditsApi);
  private readonly router = inject(Router);
  private readonly route = inject(ActivatedRoute);
  private readonly title = inject(Title);
  private readonly snackBar = inject(MatSnackBar);
  private readonly user = inject(AuthSession).user;

  /** The audit id from the address (`/audits/:id`). */
  readonly id = input.required({ transform: numberAttribute });
  /** The open area from the address (`?area=criteria`). */
  readonly area = input<string | undefined>();

  protected readonly areas = AUDIT_AREAS;
  protected readonly selectedIndex = computed(() => areaIndex(this.area()));
  protected readonly audit = signal<AuditView | null>(null);
  protected readonly failure = signal<string | null>(null);
  protected readonly isLoading = signal(true);
  protected readonly results = signal<AuditResults | null>(null);
  protected readonly isLoadingResults = signal(false);
  protected readonly operators = signal<OperatorView[]>([]);
  private readonly reloads = new BehaviorSubject<void>(undefined);
  private routeTitle: string | null = null;

  /** Only the audit lead writes; partners, clinicians and governance read (DESIGN.md §2). */
  protected readonly canWrite = computed(() => this.user()?.role === 'audit_lead');
  /** Review notes are for partners and the lead. */
  protected readonly canReadNotes = computed(() => {
    const role = this.user()?.role;
    return role === 'audit_lead' || role === 'partner';
  });
  protected readonly latestCycle = computed(() => this.audit()?.cycles.at(-1) ?? null);

  constructor() {
    // Operator names for cohort words and action owners: only roles that may see them ask.
    if (this.canReadNotes()) {
      this.api
        .operators()
        .pipe(takeUntilDestroyed())
        .subscribe({ next: (operators) => this.operators.set(operators), error: () => this.operators.set([]) });
    }
    combineLatest([toObservable(this.id), this.reloads])
      .pipe(
        tap(() => this.isLoading.set(true)),
        switchMap(([id]) =>
          this.api.get(id).pipe(
            map((audit): AuditLoad => ({ audit })),
            catchError((error: unknown) => of<AuditLoad>({ failure: loadFailure(error) })),
          ),
        ),
        tap((load) => {
          this.isLoading.set(false);
          if ('audit' in load) this.showAudit(load.audit);
          else this.failure.set(load.failure);
          this.isLoadingResults.set('audit' in load);
        }),
        // Latest results for the Criteria area; a failure leaves the table without them (the notice says why).
        switchMap((load) => ('audit' in load ? this.api.results(load.audit.id).pipe(catchError(() => of(null))) : of(null))),
        takeUntilDestroyed(),
      )
      .subscribe((results) => {
        this.isLoadingResults.set(false);
        this.results.set(results);
      });
  }

  protected showArea(index: number): void {
    const area = AUDIT_AREAS[index]?.key ?? 'scope';
    void this.router.navigate([], { relativeTo: this.route, queryParams: { area }, queryParamsHandling: 'merge', replaceUrl: true });
  }

  protected reload(): void {
    this.reloads.next();
  }

  protected scopeSaved(audit: AuditView): void {
    this.snackBar.open('The scope was saved.', 'OK', { duration: 6000 });
    this.showAudit(audit);
    // The cohort or thresholds may have changed: the latest results follow.
    this.reload();
  }

  private showAudit(audit: AuditView): void {
    this.failure.set(null);
    this.audit.set(audit);
    this.routeTitle ??= this.title.getTitle();
    this.title.setTitle(`${audit.title} · ${this.routeTitle}`);
  }
}

function loadFailure(error: unknown): string {
  if (error instanceof HttpErrorResponse && error.status === 404) return 'This audit could not be found. It may have been removed.';
  return error instanceof HttpErrorResponse ? describeHttpError(error) : 'The audit could not be loaded.';
}
