import { ChangeDetectionStrategy, Component } from '@angular/core';

/** The caution every results view and export carries (DESIGN.md §7), word for word. */
export const CLINICAL_CAUTION =
  'For clinical audit and quality improvement. Not a diagnostic tool; treatment decisions rest with the treating clinician. Follow local regulations, professional guidance and data-protection law.';

/** Shows the clinical-use caution as a quiet note. */
@Component({
  selector: 'tm-clinical-caution',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `<p class="caution">{{ text }}</p>`,
  styles: `
    .caution {
      margin: 0;
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
      max-width: 60ch;
    }
  `,
})
export class ClinicalCaution {
  protected readonly text = CLINICAL_CAUTION;
}
