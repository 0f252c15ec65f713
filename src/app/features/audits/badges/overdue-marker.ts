import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { BADGE_STYLES } from './badge-styles';

/** Marks an action that is past its due date and not finished: coral, an alarm icon and the word. */
@Component({
  selector: 'tm-overdue-marker',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  template: `<mat-icon aria-hidden="true">alarm</mat-icon><span>Overdue</span>`,
  styles: BADGE_STYLES,
  host: { class: 'attention' },
})
export class OverdueMarker {}
