import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { PlanningCheck } from '@tidemark/shared';

/** What each kind of planning check looks at, in a few words. */
const CHECK_TITLES: Readonly<Record<PlanningCheck['kind'], string>> = {
  'keratinized-tissue': 'Keratinized tissue left',
  'crest-distance': 'Margin to bone crest',
};

/**
 * The planning checks the server ran on the sites (DESIGN.md §3): guidance thresholds for
 * the clinician to weigh, never a decision, and said so every time they are shown.
 */
@Component({
  selector: 'tm-planning-guidance',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  template: `
    <section class="panel" aria-labelledby="planning-heading">
      <h3 id="planning-heading">
        <mat-icon aria-hidden="true">rule</mat-icon>
        Planning guidance
      </h3>
      <p class="caution">
        These are guidance thresholds (at least 2 mm of keratinized tissue left; the new margin about 3 mm from the
        bone crest), not decisions. The treating clinician decides.
      </p>
      @if (checks().length === 0) {
        <p class="clear">
          <mat-icon aria-hidden="true">check_circle</mat-icon>
          No site falls under a guidance threshold, as far as its recorded measurements show.
        </p>
      } @else {
        <ul class="checks">
          @for (check of checks(); track $index) {
            <li>
              <mat-icon aria-hidden="true">info</mat-icon>
              <div>
                <strong>{{ titles[check.kind] }} · tooth {{ check.tooth }}</strong>
                <span>{{ check.message }}</span>
              </div>
            </li>
          }
        </ul>
      }
    </section>
  `,
  styles: `
    .panel {
      padding: 16px 20px;
      border-radius: var(--mat-sys-corner-large);
      border: 1px solid var(--mat-sys-outline-variant);
      background: var(--mat-sys-surface-container-lowest);
    }
    h3 {
      display: flex;
      align-items: center;
      gap: 8px;
      margin: 0 0 4px;
      font: var(--mat-sys-title-medium);
    }
    .caution {
      margin: 0 0 12px;
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
      max-width: 80ch;
    }
    .clear,
    li {
      display: flex;
      align-items: flex-start;
      gap: 10px;
      margin: 0;
    }
    .checks {
      display: flex;
      flex-direction: column;
      gap: 12px;
      margin: 0;
      padding: 0;
      list-style: none;
    }
    li div {
      display: flex;
      flex-direction: column;
      gap: 2px;
    }
    li mat-icon {
      flex: none;
      color: var(--mat-sys-secondary);
    }
    .clear mat-icon {
      flex: none;
      color: var(--mat-sys-primary);
    }
  `,
})
export class PlanningGuidance {
  /** Checks from the case's `planningChecks`. */
  readonly checks = input.required<readonly PlanningCheck[]>();

  protected readonly titles = CHECK_TITLES;
}
