import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { AbstractControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { ErrorStateMatcher } from '@angular/material/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatRadioModule } from '@angular/material/radio';
import { MatSelectModule } from '@angular/material/select';
import { INDICATION_LABELS, INSTRUMENT_LABELS, PROCEDURE_LABELS, type OperatorView } from '@tidemark/shared';
import { formRevision } from '../../../shared/forms/form-revision';
import { LiveErrorStateMatcher } from '../../../shared/forms/live-error-state-matcher';
import { fieldMessage } from '../../../shared/forms/zod-validator';
import type { CaseDetailsForm } from '../case-entry-form';

/** Pockets deeper than this at the surgical sites mean the readiness guidance is not met (DESIGN.md §1). */
const READINESS_DEEPEST_POCKET_MM = 4;

/** Suture sizes offered (USP, generic terms only: DESIGN.md §1.2). */
const SUTURE_SIZES = ['3-0', '4-0', '5-0', '6-0', '7-0'];

/** New case, step two: operator, surgery, readiness, suture and status. */
@Component({
  selector: 'tm-case-step',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatRadioModule,
    MatSelectModule,
  ],
  providers: [{ provide: ErrorStateMatcher, useClass: LiveErrorStateMatcher }],
  templateUrl: './case-step.html',
  styleUrl: './case-step.scss',
})
export class CaseStep {
  /** The case half of the New case form. */
  readonly group = input.required<FormGroup<CaseDetailsForm>>();
  /** Who may be chosen as operator. */
  readonly operators = input<readonly OperatorView[]>([]);
  /** True when the signed-in person may only record their own cases (clinicians). */
  readonly isOwnCasesOnly = input(false);

  private readonly revision = formRevision(this.group);

  protected readonly procedures = Object.entries(PROCEDURE_LABELS);
  protected readonly indications = Object.entries(INDICATION_LABELS);
  protected readonly instruments = Object.entries(INSTRUMENT_LABELS);
  protected readonly sutureSizes = SUTURE_SIZES;

  protected readonly isOperated = computed(() => {
    this.revision();
    return this.group().controls.status.value === 'operated';
  });

  /** A gentle note when the deepest pocket is beyond the readiness guidance; never blocks. */
  protected readonly hasDeepPocket = computed(() => {
    this.revision();
    const deepest = this.group().controls.deepestProbingMm.value;
    return deepest !== null && deepest > READINESS_DEEPEST_POCKET_MM;
  });

  protected readonly deepestPocketGuidance = READINESS_DEEPEST_POCKET_MM;

  /** The message under a field, re-read whenever the form changes. */
  protected message(control: AbstractControl): string | null {
    this.revision();
    return fieldMessage(control);
  }
}
