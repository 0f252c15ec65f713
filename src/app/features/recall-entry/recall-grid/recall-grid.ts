import { ChangeDetectionStrategy, Component, ElementRef, inject, input } from '@angular/core';
import type { FormGroup } from '@angular/forms';
import type { SiteView } from '@tidemark/shared';
import type { PreviousReading } from '../recall-context';
import type { MeasurementForm } from '../recall-form';
import { RecallSiteRow } from '../recall-site-row/recall-site-row';

/** What the grid needs to draw one site. */
export interface RecallRow {
  site: SiteView;
  group: FormGroup<MeasurementForm>;
  previous: PreviousReading | null;
  serverNote: string | null;
}

/**
 * The recall's site grid: one row per site, fields in reading order so Tab runs along a row
 * and on to the next. Enter moves to the next field too and never saves, so a value can be
 * typed and confirmed at the chair without leaving the keyboard.
 */
@Component({
  selector: 'tm-recall-grid',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [RecallSiteRow],
  template: `
    <div class="grid" role="list" aria-label="Sites of this recall" (keydown.enter)="moveToNextField($event)">
      @for (row of rows(); track row.site.id) {
        <tm-recall-site-row
          role="listitem"
          [group]="row.group"
          [site]="row.site"
          [previous]="row.previous"
          [serverNote]="row.serverNote"
        />
      }
    </div>
  `,
  styles: `
    .grid {
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: var(--mat-sys-corner-large);
      background: var(--mat-sys-surface-container-lowest);
      overflow: hidden;
    }
  `,
})
export class RecallGrid {
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);

  /** Rows in display order (FDI number, then mid-facial, mesial, distal). */
  readonly rows = input.required<readonly RecallRow[]>();

  protected moveToNextField(event: Event): void {
    const target = event.target;
    if (!(target instanceof HTMLInputElement)) {
      return;
    }
    event.preventDefault();
    const fields = Array.from(this.host.nativeElement.querySelectorAll<HTMLInputElement>('input:not([disabled])'));
    const next = fields[fields.indexOf(target) + 1];
    next?.focus();
  }
}
