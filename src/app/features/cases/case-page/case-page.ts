import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, input, numberAttribute, signal } from '@angular/core';
import { takeUntilDestroyed, toObservable } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTabsModule } from '@angular/material/tabs';
import { Title } from '@angular/platform-browser';
import { RouterLink } from '@angular/router';
import { CASE_STATUS_LABELS, CASE_STATUS_NEXT, type CaseDetail, type CaseStatus, type PhotoView } from '@tidemark/shared';
import { BehaviorSubject, catchError, combineLatest, filter, map, of, switchMap, tap } from 'rxjs';
import { AuthSession } from '../../../core/auth/auth-session';
import { describeHttpError } from '../../../core/http/describe-http-error';
import { CaseStatusBadge } from '../../../shared/case-status-badge/case-status-badge';
import { ChangeRecordTable } from '../../../shared/change-record-table/change-record-table';
import { ClinicalCaution } from '../../../shared/clinical-caution/clinical-caution';
import { CasesApi } from '../cases-api';
import { CaseSummary } from '../case-summary/case-summary';
import { ComplicationList } from '../complication-list/complication-list';
import { PhotoGallery } from '../photo-gallery/photo-gallery';
import { PlanningGuidance } from '../planning-guidance/planning-guidance';
import { SiteGrid } from '../site-grid/site-grid';
import { STATUS_MOVE_ACTIONS, StatusMoveDialog, type StatusMove, type StatusMoveResult } from '../status-move-dialog/status-move-dialog';
import { VisitTimeline } from '../visit-timeline/visit-timeline';

/** The answer to loading a case: the case, or why it could not be shown. */
type CaseLoad = { readonly detail: CaseDetail } | { readonly failure: string };

/** One case: its facts, recall schedule, margin record, photographs, complications and change log. */
@Component({
  selector: 'tm-case-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    CaseStatusBadge,
    CaseSummary,
    ChangeRecordTable,
    ClinicalCaution,
    ComplicationList,
    MatButtonModule,
    MatIconModule,
    MatProgressBarModule,
    MatTabsModule,
    PhotoGallery,
    PlanningGuidance,
    RouterLink,
    SiteGrid,
    VisitTimeline,
  ],
  templateUrl: './case-page.html',
  styleUrl: './case-page.scss',
})
export class CasePage {
  private readonly api = inject(CasesApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly title = inject(Title);
  private readonly destroyRef = inject(DestroyRef);
  private readonly user = inject(AuthSession).user;

  /** The case id from the address (`/cases/:id`). */
  readonly id = input.required({ transform: numberAttribute });

  protected readonly detail = signal<CaseDetail | null>(null);
  protected readonly failure = signal<string | null>(null);
  protected readonly isLoading = signal(true);
  private readonly reloads = new BehaviorSubject<void>(undefined);
  /** The tab title the router set for this page ("Case · Tidemark"), kept so the patient code is added once. */
  private routeTitle: string | null = null;

  /** Audit leads record on every case; clinicians on their own; partners and admins only read. */
  protected readonly canWrite = computed(() => {
    const user = this.user();
    const detail = this.detail();
    if (!user || !detail) return false;
    return user.role === 'audit_lead' || (user.role === 'clinician' && detail.operator.id === user.id);
  });
  protected readonly moves = computed(() => {
    const detail = this.detail();
    return detail && this.canWrite() ? CASE_STATUS_NEXT[detail.status].map((to) => ({ to, ...STATUS_MOVE_ACTIONS[to] })) : [];
  });

  constructor() {
    combineLatest([toObservable(this.id), this.reloads])
      .pipe(
        tap(() => this.isLoading.set(true)),
        switchMap(([id]) =>
          this.api.get(id).pipe(
            map((detail): CaseLoad => ({ detail })),
            catchError((error: unknown) => of<CaseLoad>({ failure: loadFailure(error) })),
          ),
        ),
        takeUntilDestroyed(),
      )
      .subscribe((load) => {
        this.isLoading.set(false);
        if ('detail' in load) {
          this.showCase(load.detail);
        } else {
          this.failure.set(load.failure);
        }
      });
  }

  protected reload(): void {
    this.reloads.next();
  }

  protected moveStatus(to: CaseStatus): void {
    const detail = this.detail();
    if (!detail) return;
    const move: StatusMove = {
      caseId: detail.id,
      patientCode: detail.patient.code,
      version: detail.version,
      from: detail.status,
      to,
      sutureSize: detail.sutureSize,
    };
    this.dialog
      .open<StatusMoveDialog, StatusMove, StatusMoveResult>(StatusMoveDialog, { data: move, maxWidth: '560px' })
      .afterClosed()
      .pipe(
        filter((result) => result !== undefined),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe((result) => {
        if (result === 'reload') {
          this.reload();
          return;
        }
        this.showCase(result);
        this.snackBar.open(`The case is now ${CASE_STATUS_LABELS[result.status].toLocaleLowerCase()}.`, 'OK', { duration: 6000 });
      });
  }

  protected addPhoto(photo: PhotoView): void {
    this.detail.update((detail) => (detail ? { ...detail, photos: [...detail.photos, photo] } : detail));
  }

  /** A complication changed: load the case again so the change log shows it too. */
  protected refreshAfterComplication(): void {
    this.snackBar.open('The complication was saved.', 'OK', { duration: 6000 });
    this.reload();
  }

  private showCase(detail: CaseDetail): void {
    this.failure.set(null);
    this.detail.set(detail);
    // The router's title strategy has run by the time the case arrives; lead it with the patient code.
    this.routeTitle ??= this.title.getTitle();
    this.title.setTitle(`${detail.patient.code} · ${this.routeTitle}`);
  }
}

/** Why the case could not be shown, in one sentence. */
function loadFailure(error: unknown): string {
  if (error instanceof HttpErrorResponse && error.status === 404) {
    return 'This case could not be found. It may have been removed, or it is recorded under another operator.';
  }
  return error instanceof HttpErrorResponse ? describeHttpError(error) : 'The case could not be loaded.';
}
