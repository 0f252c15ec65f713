import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { ClinicalCaution } from '../../../shared/clinical-caution/clinical-caution';

/** One part of the workbook, as the Reports page explains it. */
interface WorkbookPart {
  readonly icon: string;
  readonly name: string;
  readonly holds: string;
}

/**
 * The workbook's sheets, under the names the server gives them (server/export/front-page-sheet.ts),
 * so the committee finds them as listed here.
 */
export const WORKBOOK_PARTS: readonly WorkbookPart[] = [
  { icon: 'article', name: 'Front page', holds: 'The audit, its cohort in words, the scope and the headline figures.' },
  { icon: 'flag', name: 'Criteria', holds: 'Each standard: target, observed value with 95% CI, met, not met or inconclusive.' },
  { icon: 'straighten', name: 'Margin outcomes', holds: 'Rebound, stability classes and retained gain per interval and subgroup.' },
  { icon: 'water_drop', name: 'Papilla', holds: 'Jemt papilla scores and their change from baseline.' },
  { icon: 'healing', name: 'Complications', holds: 'By type, Clavien–Dindo grade and operator letter, with funnel limits.' },
  { icon: 'event_available', name: 'Recall', holds: 'Recall completion per interval and loss to follow-up.' },
  { icon: 'checklist', name: 'Action plan', holds: 'Actions agreed for the cycle: owner, deadline, state.' },
  { icon: 'table_rows', name: 'Site data', holds: 'One de-identified row per site per recall.' },
  { icon: 'menu_book', name: 'Method notes', holds: 'Formulas, thresholds, statistics and their sources.' },
  { icon: 'monitoring', name: 'Charts', holds: 'Margin drift, the complications funnel and recall completion.' },
];

/** The explanation beside the builder: what the workbook holds and how it is de-identified. */
@Component({
  selector: 'tm-workbook-contents',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ClinicalCaution, MatIconModule],
  template: `
    <h2 id="contents-heading">What the workbook holds</h2>
    <p class="intro">One Excel file with these sheets:</p>
    <ul class="parts" aria-labelledby="contents-heading">
      @for (part of parts; track part.name) {
        <li>
          <mat-icon aria-hidden="true">{{ part.icon }}</mat-icon>
          <div>
            <strong>{{ part.name }}</strong>
            <span class="holds">{{ part.holds }}</span>
          </div>
        </li>
      }
    </ul>
    <h3>De-identified</h3>
    <p>
      Patients and cases get codes that exist only in this file, operators appear as letters and dates are cut to the
      month. Clinical notes and photographs never enter the workbook.
    </p>
    <tm-clinical-caution />
  `,
  styles: `
    :host {
      display: block;
    }
    h2 {
      margin: 0 0 12px;
      font: var(--mat-sys-title-medium);
    }
    h3 {
      margin: 16px 0 4px;
      font: var(--mat-sys-title-small);
    }
    p {
      margin: 2px 0 12px;
      font: var(--mat-sys-body-medium);
    }
    .parts {
      list-style: none;
      margin: 0;
      padding: 0;
    }
    li {
      display: flex;
      gap: 12px;
      margin-bottom: 10px;
      font: var(--mat-sys-body-medium);
    }
    .holds {
      display: block;
      color: var(--mat-sys-on-surface-variant);
    }
    li mat-icon {
      flex: none;
      color: var(--mat-sys-primary);
    }
  `,
})
export class WorkbookContents {
  protected readonly parts = WORKBOOK_PARTS;
}
