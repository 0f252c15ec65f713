import { BreakpointObserver } from '@angular/cdk/layout';
import { STEPPER_GLOBAL_OPTIONS } from '@angular/cdk/stepper';
import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, signal, viewChild } from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { AbstractControl } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatStepper, MatStepperModule } from '@angular/material/stepper';
import { Router } from '@angular/router';
import type { CaseDetail, OperatorView } from '@tidemark/shared';
import { catchError, map, of } from 'rxjs';
import { AuthSession } from '../../../core/auth/auth-session';
import { apiErrorDetails } from '../../../core/http/api-error-details';
import { describeHttpError } from '../../../core/http/describe-http-error';
import { formRevision } from '../../../shared/forms/form-revision';
import { SERVER_ERROR } from '../../../shared/forms/zod-validator';
import { BaselineStep } from '../baseline-step/baseline-step';
import { CaseEntryApi } from '../case-entry-api';
import { createCaseEntryForm } from '../case-entry-form';
import { STEP, caseCreateRequest, errorPlace } from '../case-create-request';
import { CaseStep } from '../case-step/case-step';
import { PatientStep } from '../patient-step/patient-step';
import { SitesStep } from '../sites-step/sites-step';

/** New case: a four-step registration of patient, surgery, sites and baseline readings. */
@Component({
  selector: 'tm-new-case-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatIconModule, MatStepperModule, BaselineStep, CaseStep, PatientStep, SitesStep],
  // Steps with problems say so with an icon and a sentence, not colour alone.
  providers: [{ provide: STEPPER_GLOBAL_OPTIONS, useValue: { showError: true, displayDefaultIndicatorType: false } }],
  templateUrl: './new-case-page.html',
  styleUrl: './new-case-page.scss',
})
export class NewCasePage {
  private readonly api = inject(CaseEntryApi);
  private readonly router = inject(Router);
  private readonly snackBar = inject(MatSnackBar);
  private readonly destroyRef = inject(DestroyRef);
  private readonly user = inject(AuthSession).user();

  /** Clinicians record their own cases only; the audit lead may choose any operator. */
  protected readonly isOwnCasesOnly = this.user?.role === 'clinician';
  protected readonly form = createCaseEntryForm(
    this.user?.role === 'clinician' || this.user?.role === 'audit_lead' ? this.user.id : null,
  );
  private readonly revision = formRevision(signal(this.form).asReadonly());

  protected readonly isVertical = toSignal(
    inject(BreakpointObserver)
      .observe('(max-width: 719.98px)')
      .pipe(map((state) => state.matches)),
    { initialValue: false },
  );

  private readonly loadedOperators = toSignal(this.api.operators().pipe(catchError(() => of<OperatorView[]>([]))), {
    initialValue: [],
  });
  /** Operators to choose from; a clinician always finds themselves, even if the list failed to load. */
  protected readonly operators = computed(() => {
    const operators = this.loadedOperators();
    const user = this.user;
    return user && this.isOwnCasesOnly && !operators.some((operator) => operator.id === user.id)
      ? [{ id: user.id, displayName: user.displayName }, ...operators]
      : operators;
  });

  protected readonly isOperated = computed(() => {
    this.revision();
    return this.form.controls.details.controls.status.value === 'operated';
  });
  protected readonly hasSites = computed(() => {
    this.revision();
    return this.form.controls.sites.length > 0;
  });
  /** The sites step shows a problem: nothing chosen after trying, or a tooth the server refused. */
  protected readonly sitesStepHasError = computed(() => {
    this.revision();
    const sites = this.form.controls.sites;
    const isEmptyAfterTrying = sites.touched && sites.length === 0;
    return isEmptyAfterTrying || sites.hasError(SERVER_ERROR) || sites.controls.some((site) => site.controls.tooth.invalid || site.controls.location.invalid);
  });

  protected readonly isSaving = signal(false);
  /** Problems that belong to no single field. */
  protected readonly failure = signal<string | null>(null);

  private readonly stepper = viewChild.required(MatStepper);

  constructor() {
    if (this.isOwnCasesOnly) {
      this.form.controls.details.controls.operatorId.disable();
    }
  }

  /** Next step, or the current step's messages when something is missing. */
  protected goNext(step: AbstractControl): void {
    if (step.invalid) {
      step.markAllAsTouched();
      return;
    }
    this.stepper().next();
  }

  protected leaveSitesStep(): void {
    if (!this.hasSites()) {
      this.form.controls.sites.markAsTouched();
      return;
    }
    this.stepper().next();
  }

  protected saveCase(): void {
    if (this.isSaving()) {
      return;
    }
    this.failure.set(null);
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      this.stepper().selectedIndex = this.firstInvalidStep();
      return;
    }
    const candidate = caseCreateRequest(this.form);
    if (!candidate.isValid) {
      this.showFieldErrors(candidate.fields, 'Some entries need correcting before the case can be saved.');
      return;
    }
    this.isSaving.set(true);
    this.api
      .createCase(candidate.request)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (created) => this.showCase(created),
        error: (error: unknown) => {
          this.isSaving.set(false);
          this.showFailure(error);
        },
      });
  }

  private showCase(created: CaseDetail): void {
    this.snackBar.open(`Case saved for patient ${created.patient.code}.`, 'OK', { duration: 6000 });
    void this.router.navigate(['/cases', created.id]);
  }

  private firstInvalidStep(): number {
    const { patient, details } = this.form.controls;
    if (patient.invalid) {
      return STEP.patient;
    }
    if (details.invalid) {
      return STEP.details;
    }
    return !this.hasSites() || this.sitesStepHasError() ? STEP.sites : STEP.baseline;
  }

  private showFailure(error: unknown): void {
    if (!(error instanceof HttpErrorResponse)) {
      this.failure.set('The case could not be saved. Try again.');
      return;
    }
    const details = apiErrorDetails(error);
    const fields = { ...details?.fields };
    // A taken patient code comes back as a conflict; it belongs on the code field.
    if (error.status === 409 && details) {
      const { code: codeMessage, ...rest } = fields;
      this.showFieldErrors({ ...rest, 'patient.code': codeMessage ?? details.message }, details.message);
      return;
    }
    if (error.status === 400 && Object.keys(fields).length) {
      this.showFieldErrors(fields, details?.message ?? null);
      return;
    }
    this.failure.set(describeHttpError(error));
  }

  /** Puts each message on its control, opens the earliest step concerned, and lists the rest. */
  private showFieldErrors(fields: Record<string, string>, summary: string | null): void {
    let firstStep: number | null = null;
    const unplaced: string[] = [];
    for (const [path, message] of Object.entries(fields)) {
      const place = errorPlace(path);
      const control = place ? this.form.get(place.path) : null;
      if (!place || !control) {
        unplaced.push(message);
        continue;
      }
      control.setErrors({ ...control.errors, [SERVER_ERROR]: message });
      control.markAsTouched();
      firstStep = firstStep === null ? place.step : Math.min(firstStep, place.step);
    }
    if (unplaced.length) {
      this.failure.set([summary, ...unplaced].filter(Boolean).join(' '));
    } else if (firstStep === null) {
      this.failure.set(summary ?? 'The case could not be saved. Try again.');
    }
    if (firstStep !== null) {
      this.stepper().selectedIndex = firstStep;
    }
  }
}
