import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { AbstractControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { ErrorStateMatcher } from '@angular/material/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatTooltipModule } from '@angular/material/tooltip';
import { siteOutcome } from '@tidemark/analytics/site-outcome';
import { REFERENCE_POINT_LABELS, SITE_LOCATION_LABELS, type SiteView } from '@tidemark/shared';
import { formRevision } from '../../../shared/forms/form-revision';
import { LiveErrorStateMatcher } from '../../../shared/forms/live-error-state-matcher';
import { MEASUREMENT_HELP } from '../../../shared/measurement-help/measurement-help';
import { fieldMessage } from '../../../shared/forms/zod-validator';
import { MillimetresPipe } from '../../../shared/millimetres/millimetres-pipe';
import { StabilityBadge } from '../../../shared/stability-badge/stability-badge';
import { isLargeChange, type PreviousReading } from '../recall-context';
import type { MeasurementForm } from '../recall-form';

/**
 * One site of the recall grid: where it is, its baseline and post-op REF→GM, the readings of
 * this recall, and — live as REF→GM is typed — rebound, retained gain and stability class from
 * `siteOutcome`, the same function the server uses (DESIGN.md §3).
 */
@Component({
  selector: 'tm-recall-site-row',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatCheckboxModule, MatFormFieldModule, MatIconModule, MatInputModule, MatTooltipModule, MillimetresPipe, StabilityBadge],
  providers: [{ provide: ErrorStateMatcher, useClass: LiveErrorStateMatcher }],
  templateUrl: './recall-site-row.html',
  styleUrl: './recall-site-row.scss',
})
export class RecallSiteRow {
  /** The row's controls. */
  readonly group = input.required<FormGroup<MeasurementForm>>();
  /** The site as recorded on the case. */
  readonly site = input.required<SiteView>();
  /** The reading a new REF→GM is compared with (last recall, else post-op), if any. */
  readonly previous = input<PreviousReading | null>(null);
  /** The server's large-change note for this row, when it asked for a confirmation. */
  readonly serverNote = input<string | null>(null);

  /**
   * Each reading's convention (DESIGN.md §3), shown on keyboard focus or hover and read out as the
   * field's description; a tooltip adds no tab stop, so Tab still runs straight along the row.
   */
  protected readonly help = MEASUREMENT_HELP;

  private readonly revision = formRevision(this.group);

  protected readonly locationLabel = computed(() => SITE_LOCATION_LABELS[this.site().location]);
  protected readonly name = computed(() => `${this.site().tooth} · ${this.locationLabel()}`);
  protected readonly referencePoint = computed(() => REFERENCE_POINT_LABELS[this.site().referencePoint].toLowerCase());
  protected readonly isPapillaSite = computed(() => this.site().location !== 'mid-facial');

  /** REF→GM when it is a valid reading, else null (nothing is computed from a bad entry). */
  private readonly refGm = computed(() => {
    this.revision();
    const control = this.group().controls.refGm;
    return control.valid ? control.value : null;
  });

  protected readonly outcome = computed(() => {
    const refGm = this.refGm();
    const site = this.site();
    return refGm === null ? null : siteOutcome({ baselineRefGm: site.baselineRefGm, postOpRefGm: site.postOpRefGm, recallRefGm: refGm });
  });

  /** The change since the previous reading when it exceeds 3 mm, for the warning beside REF→GM. */
  protected readonly largeChange = computed(() => {
    const refGm = this.refGm();
    const previous = this.previous();
    return refGm !== null && previous !== null && isLargeChange(refGm, previous) ? { by: Math.abs(refGm - previous.refGm), previous } : null;
  });

  /** The message under a field, re-read whenever the form changes. */
  protected message(control: AbstractControl): string | null {
    this.revision();
    return fieldMessage(control);
  }
}
