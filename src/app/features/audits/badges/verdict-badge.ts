import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { StandardResult } from '@tidemark/shared';
import { BADGE_STYLES, type BadgeLook } from './badge-styles';

/** A standard's verdict against its target (DESIGN.md §4: inconclusive when the CI straddles it). */
export const VERDICT_LOOK: Readonly<Record<StandardResult['verdict'], BadgeLook>> = {
  met: { icon: 'check_circle', word: 'Met', tone: 'calm' },
  'not-met': { icon: 'cancel', word: 'Not met', tone: 'attention' },
  inconclusive: { icon: 'help', word: 'Inconclusive', tone: 'quiet' },
  'no-data': { icon: 'do_not_disturb_on', word: 'No data', tone: 'quiet' },
};

/** Met / not met / inconclusive / no data as an icon and a word. */
@Component({
  selector: 'tm-verdict-badge',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  template: `<mat-icon aria-hidden="true">{{ look().icon }}</mat-icon><span>{{ look().word }}</span>`,
  styles: BADGE_STYLES,
  host: { '[class]': 'look().tone' },
})
export class VerdictBadge {
  /** The verdict from the server. */
  readonly verdict = input.required<StandardResult['verdict']>();

  protected readonly look = computed(() => VERDICT_LOOK[this.verdict()]);
}
