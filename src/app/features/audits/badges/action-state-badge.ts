import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { ACTION_STATE_LABELS, type ActionState } from '@tidemark/shared';
import { BADGE_STYLES, type BadgeLook } from './badge-styles';

/** Icon and word per action state. */
export const ACTION_STATE_LOOK: Readonly<Record<ActionState, BadgeLook>> = {
  open: { icon: 'radio_button_unchecked', word: ACTION_STATE_LABELS.open, tone: 'quiet' },
  'under-way': { icon: 'pending', word: ACTION_STATE_LABELS['under-way'], tone: 'calm' },
  done: { icon: 'check_circle', word: ACTION_STATE_LABELS.done, tone: 'calm' },
  dropped: { icon: 'block', word: ACTION_STATE_LABELS.dropped, tone: 'quiet' },
};

/** An action's state as an icon and a word. */
@Component({
  selector: 'tm-action-state-badge',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  template: `<mat-icon aria-hidden="true">{{ look().icon }}</mat-icon><span>{{ look().word }}</span>`,
  styles: BADGE_STYLES,
  host: { '[class]': 'look().tone' },
})
export class ActionStateBadge {
  /** The action's state. */
  readonly state = input.required<ActionState>();

  protected readonly look = computed(() => ACTION_STATE_LOOK[this.state()]);
}

/** Whether an action is past its due date and still to be done (open or under way). */
export function isActionOverdue(action: { readonly dueDate: string; readonly state: ActionState }, today: string): boolean {
  return action.dueDate < today && (action.state === 'open' || action.state === 'under-way');
}
