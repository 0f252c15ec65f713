import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import {
  DIABETES_LABELS,
  INDICATION_LABELS,
  INSTRUMENT_LABELS,
  PHENOTYPE_LABELS,
  PHENOTYPE_METHOD_LABELS,
  PROCEDURE_LABELS,
  SEX_LABELS,
  SMOKING_LABELS,
  type CaseDetail,
} from '@tidemark/shared';
import { LocalDatePipe } from '../../../shared/dates/local-date-pipe';

/** One risk factor as a phrase, with whether it raises the risk of rebound or poor healing. */
interface RiskFactor {
  readonly text: string;
  readonly isRaised: boolean;
}

/** The facts of a case at a glance: patient, phenotype, risk factors, procedure, operator, surgery. */
@Component({
  selector: 'tm-case-summary',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [LocalDatePipe, MatIconModule],
  templateUrl: './case-summary.html',
  styleUrl: './case-summary.scss',
})
export class CaseSummary {
  readonly detail = input.required<CaseDetail>();

  protected readonly phenotype = computed(() => PHENOTYPE_LABELS[this.detail().patient.phenotype]);
  protected readonly phenotypeMethod = computed(() => PHENOTYPE_METHOD_LABELS[this.detail().patient.phenotypeMethod]);
  protected readonly procedure = computed(() => PROCEDURE_LABELS[this.detail().procedure]);
  protected readonly indication = computed(() => INDICATION_LABELS[this.detail().indication]);
  protected readonly instrument = computed(() => INSTRUMENT_LABELS[this.detail().instrument]);
  protected readonly patientLine = computed(() => {
    const patient = this.detail().patient;
    return `Born ${patient.birthYear} · ${SEX_LABELS[patient.sex]}`;
  });
  protected readonly riskFactors = computed<RiskFactor[]>(() => {
    const patient = this.detail().patient;
    const smoking = SMOKING_LABELS[patient.smoking];
    return [
      {
        text: patient.smoking === 'current' && patient.cigarettesPerDay ? `${smoking}, ${patient.cigarettesPerDay} a day` : smoking,
        isRaised: patient.smoking === 'current',
      },
      { text: DIABETES_LABELS[patient.diabetes], isRaised: patient.diabetes !== 'none' },
    ];
  });
  protected readonly readiness = computed(() => {
    const detail = this.detail();
    const parts = [detail.hygienePhaseComplete ? 'Hygiene phase complete' : 'Hygiene phase not complete'];
    if (detail.bleedingScorePct !== null) parts.push(`bleeding ${detail.bleedingScorePct} %`);
    if (detail.plaqueScorePct !== null) parts.push(`plaque ${detail.plaqueScorePct} %`);
    return parts.join(' · ');
  });
}
