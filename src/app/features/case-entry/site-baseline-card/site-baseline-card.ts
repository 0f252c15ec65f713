import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { AbstractControl, FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { ErrorStateMatcher } from '@angular/material/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatTooltipModule } from '@angular/material/tooltip';
import { planningCheck } from '@tidemark/analytics/planning-check';
import { PAPILLA_SCORE_LABELS, REFERENCE_POINT_LABELS, SITE_LOCATION_LABELS } from '@tidemark/shared';
import { formRevision } from '../../../shared/forms/form-revision';
import { LiveErrorStateMatcher } from '../../../shared/forms/live-error-state-matcher';
import { MEASUREMENT_HELP } from '../../../shared/measurement-help/measurement-help';
import { fieldMessage } from '../../../shared/forms/zod-validator';
import type { SiteForm } from '../case-entry-form';
import { PlanningCheckPanel } from '../planning-check-panel/planning-check-panel';

/** A reading the planning check may use: valid and present, else null (the check is skipped). */
function usableReading(control: FormControl<number | null>): number | null {
  return control.valid ? control.value : null;
}

/** Baseline readings of one site, with its planning check computed live as values are typed. */
@Component({
  selector: 'tm-site-baseline-card',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule, MatSelectModule, MatTooltipModule, PlanningCheckPanel],
  providers: [{ provide: ErrorStateMatcher, useClass: LiveErrorStateMatcher }],
  templateUrl: './site-baseline-card.html',
  styleUrl: './site-baseline-card.scss',
})
export class SiteBaselineCard {
  /** The site's controls. */
  readonly group = input.required<FormGroup<SiteForm>>();
  /** Whether post-op readings are asked for (the case is registered as operated). */
  readonly isOperated = input(false);

  private readonly revision = formRevision(this.group);

  protected readonly referencePoints = Object.entries(REFERENCE_POINT_LABELS);
  /** Each reading's convention: a hint under the field, the whole of it on focus or hover (DESIGN.md §3). */
  protected readonly help = MEASUREMENT_HELP;
  protected readonly papillaScores = PAPILLA_SCORE_LABELS.map((label, score) => ({ score, label }));

  protected readonly title = computed(() => {
    this.revision();
    const { tooth, location } = this.group().controls;
    return `${tooth.value} · ${SITE_LOCATION_LABELS[location.value]}`;
  });

  protected readonly isPapillaSite = computed(() => {
    this.revision();
    return this.group().controls.location.value !== 'mid-facial';
  });

  /** Planning check (analytics/planning-check), the same function the server runs. */
  protected readonly warnings = computed(() => {
    this.revision();
    const { ktWidth, marginToCrest, plannedExcision } = this.group().controls;
    return planningCheck({
      ktWidth: usableReading(ktWidth),
      marginToCrest: usableReading(marginToCrest),
      plannedExcision: usableReading(plannedExcision),
    });
  });

  /** The message under a field, re-read whenever the form changes. */
  protected message(control: AbstractControl): string | null {
    this.revision();
    return fieldMessage(control);
  }
}
