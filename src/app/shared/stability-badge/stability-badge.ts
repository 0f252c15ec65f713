import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatTooltipModule } from '@angular/material/tooltip';
import type { StabilityClass } from '@tidemark/shared';

/** Icon and word per stability class (DESIGN.md §3); coral only where the margin relapsed. */
export const STABILITY_LOOK: Readonly<Record<StabilityClass, { icon: string; word: string }>> = {
  stable: { icon: 'check_circle', word: 'stable' },
  minor: { icon: 'radio_button_partial', word: 'minor' },
  relapse: { icon: 'warning', word: 'relapse' },
};

/** Why a site is flagged, in the trade's words. */
export const REVIEW_FLAG_EXPLANATION =
  'Negative rebound: the margin sits further apical than placed. Check for recession or over-exposure.';

/**
 * A site's stability class at a recall, as an icon and a word, plus a "review" marker
 * when the server flagged a negative rebound. The class itself comes from the API.
 */
@Component({
  selector: 'tm-stability-badge',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule, MatTooltipModule],
  template: `
    @if (look(); as shown) {
      <span [class]="'class ' + stability()">
        <mat-icon aria-hidden="true">{{ shown.icon }}</mat-icon>{{ shown.word }}
      </span>
    } @else {
      <span class="class none">no class</span>
    }
    @if (isFlaggedForReview()) {
      <span class="flag" [matTooltip]="flagExplanation" tabindex="0" [attr.aria-label]="'Flagged for review. ' + flagExplanation">
        <mat-icon aria-hidden="true">flag</mat-icon>review
      </span>
    }
  `,
  styles: `
    :host {
      display: inline-flex;
      flex-wrap: wrap;
      gap: 4px;
    }
    .class,
    .flag {
      display: inline-flex;
      align-items: center;
      gap: 4px;
      padding: 2px 10px 2px 6px;
      border-radius: var(--mat-sys-corner-full);
      font: var(--mat-sys-label-medium);
      white-space: nowrap;
    }
    mat-icon {
      width: 18px;
      height: 18px;
      font-size: 18px;
    }
    .stable {
      background: var(--mat-sys-secondary-container);
      color: var(--mat-sys-on-secondary-container);
    }
    .minor {
      box-shadow: inset 0 0 0 1px var(--mat-sys-outline);
      color: var(--mat-sys-on-surface);
    }
    .relapse {
      background: var(--tm-attention-container);
      color: var(--tm-on-attention-container);
    }
    .none {
      color: var(--mat-sys-on-surface-variant);
    }
    .flag {
      box-shadow: inset 0 0 0 1.5px var(--tm-attention);
      color: var(--mat-sys-on-surface);
    }
  `,
})
export class StabilityBadge {
  /** Stability class from the server's outcome; null when no rebound could be computed. */
  readonly stability = input.required<StabilityClass | null>();
  /** Whether the server flagged the site for review (negative rebound). */
  readonly isFlaggedForReview = input(false);

  protected readonly flagExplanation = REVIEW_FLAG_EXPLANATION;
  protected readonly look = computed(() => {
    const stability = this.stability();
    return stability ? STABILITY_LOOK[stability] : null;
  });
}
