import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { CYCLE_STATE_LABELS, type CycleState } from '@tidemark/shared';
import { BADGE_STYLES, type BadgeLook } from './badge-styles';

/** Icon per cycle stage; the word comes from the shared labels. A reported cycle wears a lock: its results are frozen. */
export const CYCLE_STAGE_LOOK: Readonly<Record<CycleState, BadgeLook>> = {
  scoping: { icon: 'edit_note', word: CYCLE_STATE_LABELS.scoping, tone: 'quiet' },
  gathering: { icon: 'playlist_add', word: CYCLE_STATE_LABELS.gathering, tone: 'calm' },
  weighing: { icon: 'balance', word: CYCLE_STATE_LABELS.weighing, tone: 'calm' },
  reported: { icon: 'lock', word: CYCLE_STATE_LABELS.reported, tone: 'calm' },
  closed: { icon: 'task_alt', word: CYCLE_STATE_LABELS.closed, tone: 'quiet' },
};

/** An audit cycle's stage as an icon and a word. */
@Component({
  selector: 'tm-cycle-stage-badge',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  template: `<mat-icon aria-hidden="true">{{ look().icon }}</mat-icon><span>{{ look().word }}</span>`,
  styles: BADGE_STYLES,
  host: { '[class]': 'look().tone' },
})
export class CycleStageBadge {
  /** The cycle's stage. */
  readonly stage = input.required<CycleState>();

  protected readonly look = computed(() => CYCLE_STAGE_LOOK[this.stage()]);
}
