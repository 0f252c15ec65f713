import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { AbstractControl, FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { ErrorStateMatcher } from '@angular/material/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatRadioModule } from '@angular/material/radio';
import { MatSelectModule } from '@angular/material/select';
import {
  DIABETES_LABELS,
  PHENOTYPE_LABELS,
  PHENOTYPE_METHOD_LABELS,
  SEX_LABELS,
  SMOKING_LABELS,
  type PatientView,
} from '@tidemark/shared';
import { catchError, debounceTime, distinctUntilChanged, map, of, switchMap } from 'rxjs';
import { formRevision } from '../../../shared/forms/form-revision';
import { LiveErrorStateMatcher } from '../../../shared/forms/live-error-state-matcher';
import { fieldMessage } from '../../../shared/forms/zod-validator';
import { CaseEntryApi } from '../case-entry-api';
import type { PatientChoiceForm } from '../case-entry-form';

/** Shortest code fragment worth a search. */
const MIN_SEARCH_LENGTH = 2;

/** New case, step one: find a patient code already on file, or register a new pseudonymised patient. */
@Component({
  selector: 'tm-patient-step',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatRadioModule,
    MatSelectModule,
  ],
  providers: [{ provide: ErrorStateMatcher, useClass: LiveErrorStateMatcher }],
  templateUrl: './patient-step.html',
  styleUrl: './patient-step.scss',
})
export class PatientStep {
  private readonly api = inject(CaseEntryApi);

  /** The patient half of the New case form. */
  readonly group = input.required<FormGroup<PatientChoiceForm>>();

  private readonly revision = formRevision(this.group);
  protected readonly mode = computed(() => {
    this.revision();
    return this.group().controls.mode.value;
  });
  protected readonly isCurrentSmoker = computed(() => {
    this.revision();
    return this.group().controls.newPatient.controls.smoking.value === 'current';
  });

  protected readonly labels = {
    sex: Object.entries(SEX_LABELS),
    smoking: Object.entries(SMOKING_LABELS),
    diabetes: Object.entries(DIABETES_LABELS),
    phenotype: Object.entries(PHENOTYPE_LABELS),
    phenotypeMethod: Object.entries(PHENOTYPE_METHOD_LABELS),
  };
  protected readonly sexLabels = SEX_LABELS;

  /** What is typed into the code search (not part of the request). */
  protected readonly search = new FormControl('', { nonNullable: true });

  /** Search results; null before a search was made. */
  protected readonly results = toSignal(
    this.search.valueChanges.pipe(
      debounceTime(250),
      map((code) => code.trim()),
      distinctUntilChanged(),
      switchMap((code) =>
        code.length < MIN_SEARCH_LENGTH
          ? of(null)
          : this.api.findPatients(code).pipe(catchError(() => of<PatientView[]>([]))),
      ),
    ),
    { initialValue: null },
  );

  /** The message under a field, re-read whenever the form changes. */
  protected message(control: AbstractControl): string | null {
    this.revision();
    return fieldMessage(control);
  }

  /** Whether a field's message should show (after typing, leaving it, or a save attempt). */
  protected isShown(control: AbstractControl): boolean {
    this.revision();
    return control.invalid && (control.touched || control.dirty);
  }
}
