import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { takeUntilDestroyed, toObservable } from '@angular/core/rxjs-interop';
import { FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatChipsModule } from '@angular/material/chips';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import {
  DIABETES_LABELS,
  DIABETES_STATUSES,
  INDICATIONS,
  INDICATION_LABELS,
  PHENOTYPES,
  PHENOTYPE_LABELS,
  PROCEDURES,
  PROCEDURE_LABELS,
  REGIONS,
  REGION_LABELS,
  SMOKING_LABELS,
  SMOKING_STATUSES,
  type CohortDefinition,
  type CohortPreview,
  type OperatorView,
} from '@tidemark/shared';
import { catchError, debounceTime, distinctUntilChanged, map, of, startWith, switchMap, tap } from 'rxjs';
import { fieldMessage } from '../../../shared/forms/zod-validator';
import { ToothPicker } from '../../../shared/tooth-picker/tooth-picker';
import { formRevision } from '../../../shared/forms/form-revision';
import { AuditsApi } from '../audits-api';
import { parsedCohort, type CohortForm } from '../scope/audit-form';

/** Typing and tapping settle for this long before the count is asked for again. */
export const COUNT_PAUSE_MS = 300;

/** One group of chips: which cohort list it fills and the words for each choice. */
interface ChipGroup {
  readonly name: Exclude<keyof CohortForm, 'surgeryFrom' | 'surgeryTo' | 'teeth'>;
  readonly legend: string;
  readonly options: readonly { readonly value: string | number; readonly label: string }[];
}

/** What the live count shows. */
type CountState =
  | { readonly kind: 'counting'; readonly last: CohortPreview | null }
  | { readonly kind: 'counted'; readonly preview: CohortPreview }
  | { readonly kind: 'unfinished' }
  | { readonly kind: 'failed' };

const optionsOf = <K extends string>(keys: readonly K[], labels: Readonly<Record<K, string>>) => keys.map((value) => ({ value, label: labels[value] }));

/**
 * Builds an audit's cohort from chips, dates and a tooth chart, and keeps a live count of the
 * cases, patients and sites it takes in. Works on the parent's form group.
 */
@Component({
  selector: 'tm-cohort-builder',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatChipsModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule, ReactiveFormsModule, ToothPicker],
  templateUrl: './cohort-builder.html',
  styleUrl: './cohort-builder.scss',
})
export class CohortBuilder {
  private readonly api = inject(AuditsApi);

  /** The cohort controls of the audit form. */
  readonly cohort = input.required<FormGroup<CohortForm>>();
  /** Operators to choose from. */
  readonly operators = input<readonly OperatorView[]>([]);

  protected readonly fieldMessage = fieldMessage;
  protected readonly count = signal<CountState>({ kind: 'counting', last: null });
  /** The numbers on show: the latest count, kept (dimmed) while a newer one is on its way. */
  protected readonly shownCount = computed(() => {
    const state = this.count();
    return state.kind === 'counted' ? state.preview : state.kind === 'counting' ? state.last : null;
  });
  private readonly revision = formRevision(this.cohort);
  protected readonly teeth = computed(() => {
    this.revision();
    return [...this.cohort().controls.teeth.value].sort((a, b) => a - b);
  });
  protected readonly isTeethOpen = signal(false);

  protected readonly groups = computed<ChipGroup[]>(() => [
    { name: 'regions', legend: 'Region', options: optionsOf(REGIONS, REGION_LABELS) },
    { name: 'indications', legend: 'Indication', options: optionsOf(INDICATIONS, INDICATION_LABELS) },
    { name: 'procedures', legend: 'Procedure', options: optionsOf(PROCEDURES, PROCEDURE_LABELS) },
    { name: 'operatorIds', legend: 'Operator', options: this.operators().map((operator) => ({ value: operator.id, label: operator.displayName })) },
    { name: 'phenotypes', legend: 'Gingival phenotype', options: optionsOf(PHENOTYPES, PHENOTYPE_LABELS) },
    { name: 'smoking', legend: 'Smoking', options: optionsOf(SMOKING_STATUSES, SMOKING_LABELS) },
    { name: 'diabetes', legend: 'Diabetes', options: optionsOf(DIABETES_STATUSES, DIABETES_LABELS) },
  ]);

  constructor() {
    toObservable(this.cohort)
      .pipe(
        switchMap((group) => group.valueChanges.pipe(startWith(null), map(() => parsedCohort(group.getRawValue())))),
        debounceTime(COUNT_PAUSE_MS),
        distinctUntilChanged((a, b) => JSON.stringify(a) === JSON.stringify(b)),
        tap((cohort) => {
          this.count.set(cohort ? { kind: 'counting', last: this.shownCount() } : { kind: 'unfinished' });
        }),
        // A newer definition cancels the count of an older one, so the number never lags behind the chips.
        switchMap((cohort) => (cohort ? this.countOf(cohort) : of(null))),
        takeUntilDestroyed(),
      )
      .subscribe((state) => {
        if (state) this.count.set(state);
      });
  }

  protected toggleTooth(tooth: number): void {
    const control = this.cohort().controls.teeth;
    const teeth = control.value;
    control.setValue(teeth.includes(tooth) ? teeth.filter((chosen) => chosen !== tooth) : [...teeth, tooth]);
    control.markAsDirty();
  }

  protected toggleTeethChart(): void {
    this.isTeethOpen.update((open) => !open);
  }

  private countOf(cohort: CohortDefinition) {
    return this.api.previewCohort(cohort).pipe(
      map((preview): CountState => ({ kind: 'counted', preview })),
      catchError(() => of<CountState>({ kind: 'failed' })),
    );
  }
}
