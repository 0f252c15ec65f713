import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import {
  DEFAULT_RECALL_SCHEDULE,
  REFERENCE_POINT_LABELS,
  SITE_LOCATION_LABELS,
  type SiteMeasurementView,
  type SiteView,
  type VisitView,
} from '@tidemark/shared';
import { MillimetresPipe } from '../../../shared/millimetres/millimetres-pipe';
import { StabilityBadge } from '../../../shared/stability-badge/stability-badge';
import { LocalDatePipe } from '../../../shared/dates/local-date-pipe';

/** One row of the grid: a site and its reading at each visit (null where not measured). */
interface SiteRow {
  readonly site: SiteView;
  readonly location: string;
  /** Lower-cased to read inside a sentence ("from incisal edge"). */
  readonly referencePoint: string;
  readonly readings: readonly (SiteMeasurementView | null)[];
}

/** Visits in schedule order (unknown intervals after, by date), as the columns run. */
export function visitsInScheduleOrder(visits: readonly VisitView[]): VisitView[] {
  const rank = (visit: VisitView) => {
    const index = DEFAULT_RECALL_SCHEDULE.findIndex((interval) => interval.key === visit.intervalKey);
    return index === -1 ? DEFAULT_RECALL_SCHEDULE.length : index;
  };
  return [...visits].sort((a, b) => rank(a) - rank(b) || a.visitDate.localeCompare(b.visitDate));
}

/**
 * The margin record: one row per site, its baseline, post-op and crown gain, then each
 * recall's REF→GM with the rebound and stability class the server computed. Nothing is
 * recomputed here, so the grid always agrees with the audit results.
 */
@Component({
  selector: 'tm-site-grid',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [LocalDatePipe, MillimetresPipe, StabilityBadge],
  templateUrl: './site-grid.html',
  styleUrl: './site-grid.scss',
})
export class SiteGrid {
  readonly sites = input.required<readonly SiteView[]>();
  readonly visits = input.required<readonly VisitView[]>();

  protected readonly columns = computed(() => visitsInScheduleOrder(this.visits()));
  protected readonly rows = computed<SiteRow[]>(() => {
    const columns = this.columns();
    return this.sites().map((site) => ({
      site,
      location: SITE_LOCATION_LABELS[site.location],
      referencePoint: REFERENCE_POINT_LABELS[site.referencePoint].toLocaleLowerCase(),
      readings: columns.map((visit) => visit.measurements.find((measurement) => measurement.siteId === site.id) ?? null),
    }));
  });
}
