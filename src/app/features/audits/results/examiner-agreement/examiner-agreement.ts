import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { CalibrationResult } from '@tidemark/shared';
import { NOT_AVAILABLE, formatInterval, formatMm, formatNumber, formatProportion } from '../chart-kit/result-format';

/** One fact of the panel. */
interface AgreementFact {
  readonly term: string;
  readonly value: string;
}

/** How the target reads: icon, word and tone (never the colour alone). */
interface TargetVerdict {
  readonly icon: string;
  readonly text: string;
  readonly tone: 'met' | 'not-met' | 'unknown';
}

/** The calibration target's wording (Andrade et al. 2012). */
export const CALIBRATION_TARGET = 'more than 90% of repeat readings within ±1 mm and weighted κ above 0.6 (Andrade et al. 2012)';

/** The examiner-agreement facts in words. */
export function agreementFacts(calibration: CalibrationResult): AgreementFact[] {
  const { kappa, icc, blandAltman } = calibration;
  const mm = (value: number) => formatNumber(value, 2);
  return [
    { term: 'Paired readings', value: String(calibration.pairs) },
    { term: 'Within ±1 mm', value: formatProportion(calibration.withinOneMm) },
    { term: 'Weighted κ (linear)', value: kappa ? `${formatNumber(kappa.kappa, 2)}, ${kappa.band}` : NOT_AVAILABLE },
    { term: 'ICC (2,1), absolute agreement', value: icc ? formatNumber(icc.icc21, 2) : NOT_AVAILABLE },
    { term: 'Bland–Altman bias', value: blandAltman ? formatMm(blandAltman.bias) : NOT_AVAILABLE },
    { term: '95% limits of agreement', value: blandAltman ? `${formatInterval(blandAltman.lower, blandAltman.upper, mm)} mm` : NOT_AVAILABLE },
  ];
}

/** Whether the calibration target is met, as icon and words. */
export function targetVerdict(calibration: CalibrationResult): TargetVerdict {
  switch (calibration.meetsCalibrationTarget) {
    case true:
      return { icon: 'verified', text: 'Calibration target met', tone: 'met' };
    case false:
      return { icon: 'warning', text: 'Calibration target not met', tone: 'not-met' };
    default:
      return { icon: 'help', text: 'Too few paired readings to judge', tone: 'unknown' };
  }
}

/** "Examiner agreement": how far repeated REF→GM readings agree, and whether the calibration target is met. */
@Component({
  selector: 'tm-examiner-agreement',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  template: `
    <section class="panel" aria-labelledby="examiner-agreement-heading">
      <h3 id="examiner-agreement-heading">Examiner agreement</h3>
      @if (calibration(); as found) {
        <p [class]="'verdict ' + verdict()?.tone">
          <mat-icon aria-hidden="true">{{ verdict()?.icon }}</mat-icon>
          <span>{{ verdict()?.text }}</span>
        </p>
        <p class="target">Target: {{ target }}.</p>
        <dl class="facts">
          @for (fact of facts(); track fact.term) {
            <div>
              <dt>{{ fact.term }}</dt>
              <dd>{{ fact.value }}</dd>
            </div>
          }
        </dl>
      } @else {
        <p class="target">{{ pendingText() }}</p>
      }
    </section>
  `,
  styleUrl: './examiner-agreement.scss',
})
export class ExaminerAgreement {
  /** The calibration result, or null while it loads or when it failed. */
  readonly calibration = input.required<CalibrationResult | null>();
  /** Why there is no result yet ("Loading…" or a failure sentence). */
  readonly pendingText = input('Loading…');

  protected readonly target = CALIBRATION_TARGET;
  protected readonly facts = computed(() => {
    const calibration = this.calibration();
    return calibration ? agreementFacts(calibration) : [];
  });
  protected readonly verdict = computed(() => {
    const calibration = this.calibration();
    return calibration ? targetVerdict(calibration) : null;
  });
}
