import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { AbstractControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { ErrorStateMatcher } from '@angular/material/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { formRevision } from '../../../shared/forms/form-revision';
import { LiveErrorStateMatcher } from '../../../shared/forms/live-error-state-matcher';
import { fieldMessage } from '../../../shared/forms/zod-validator';
import type { RecallForm } from '../recall-form';

/** The visit itself: date, patient-reported pain and satisfaction, notes, and the reason when correcting. */
@Component({
  selector: 'tm-visit-fields',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatFormFieldModule, MatIconModule, MatInputModule],
  providers: [{ provide: ErrorStateMatcher, useClass: LiveErrorStateMatcher }],
  template: `
    <div class="fields" [formGroup]="group()">
      @if (isCorrection()) {
        <mat-form-field appearance="outline" subscriptSizing="dynamic" class="reason">
          <mat-label>Reason for the change</mat-label>
          <input matInput formControlName="reason" autocomplete="off" />
          <mat-hint>Required: kept in the change history with the old and new values.</mat-hint>
          <mat-error>{{ message(group().controls.reason) }}</mat-error>
        </mat-form-field>
      }
      <mat-form-field appearance="outline" subscriptSizing="dynamic">
        <mat-label>Visit date</mat-label>
        <input matInput formControlName="visitDate" type="date" />
        <mat-error>{{ message(group().controls.visitDate) }}</mat-error>
      </mat-form-field>
      <mat-form-field appearance="outline" subscriptSizing="dynamic" floatLabel="always" class="scale">
        <mat-label>Pain 0–10</mat-label>
        <input matInput formControlName="pain" type="number" inputmode="numeric" min="0" max="10" step="1" />
        <mat-hint>0 = none</mat-hint>
        <mat-error>{{ message(group().controls.pain) }}</mat-error>
      </mat-form-field>
      <mat-form-field appearance="outline" subscriptSizing="dynamic" floatLabel="always" class="scale">
        <mat-label>Satisfaction 0–10</mat-label>
        <input matInput formControlName="satisfaction" type="number" inputmode="numeric" min="0" max="10" step="1" />
        <mat-hint>10 = fully satisfied</mat-hint>
        <mat-error>{{ message(group().controls.satisfaction) }}</mat-error>
      </mat-form-field>
      <mat-form-field appearance="outline" subscriptSizing="dynamic" class="notes">
        <mat-label>Notes</mat-label>
        <textarea matInput formControlName="notes" rows="1"></textarea>
        <mat-error>{{ message(group().controls.notes) }}</mat-error>
      </mat-form-field>
    </div>
  `,
  styles: `
    .fields {
      display: flex;
      flex-wrap: wrap;
      align-items: flex-start;
      gap: 16px;
    }
    .scale {
      width: 170px;
    }
    .notes {
      flex: 1 1 260px;
    }
    .reason {
      flex: 1 1 100%;
      max-width: 720px;
    }
  `,
})
export class VisitFields {
  /** The recall form (only the visit-level controls are shown here). */
  readonly group = input.required<FormGroup<RecallForm>>();
  /** Whether a reason is asked for (correcting a recorded recall). */
  readonly isCorrection = input(false);

  private readonly revision = formRevision(this.group);

  /** The message under a field, re-read whenever the form changes. */
  protected message(control: AbstractControl): string | null {
    this.revision();
    return fieldMessage(control);
  }
}
