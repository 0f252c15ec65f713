import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { PlanningWarning } from '@tidemark/analytics/planning-check';
import { MillimetresPipe } from '../../../shared/millimetres/millimetres-pipe';

/**
 * The planning check for one site (DESIGN.md §3), as guidance: what would remain after the
 * planned excision, the threshold and its source, what to consider, and that the decision
 * stays with the clinician. It never blocks saving.
 */
@Component({
  selector: 'tm-planning-check-panel',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule, MillimetresPipe],
  template: `
    @if (warnings().length) {
      <div class="panel">
        <p class="title"><mat-icon aria-hidden="true">explore</mat-icon>Planning check — worth a second look</p>
        <ul>
          @for (warning of warnings(); track warning.kind) {
            @if (warning.kind === 'keratinized-tissue') {
              <li>
                About {{ warning.remaining | millimetres }} of keratinized tissue would remain; guidance keeps at least
                {{ warning.threshold | millimetres }} (Lang &amp; Löe 1972).
              </li>
            } @else {
              <li>
                The new margin would sit about {{ warning.remaining | millimetres }} from the bone crest; guidance keeps
                about {{ warning.threshold | millimetres }} (common practice).
              </li>
            }
          }
        </ul>
        <p class="advice">Consider osseous recontouring / an apically positioned flap rather than excision alone.</p>
        <p class="caution">Guidance thresholds, not a decision: the treatment choice rests with the treating clinician. Saving is not blocked.</p>
      </div>
    }
  `,
  styles: `
    :host {
      display: block;
    }
    .panel {
      padding: 12px 16px;
      border-radius: var(--mat-sys-corner-medium);
      border-left: 4px solid var(--tm-attention);
      background: var(--tm-attention-container);
      color: var(--tm-on-attention-container);
      font: var(--mat-sys-body-medium);
    }
    .title {
      display: flex;
      align-items: center;
      gap: 8px;
      margin: 0;
      font: var(--mat-sys-title-small);
    }
    ul {
      margin: 6px 0;
      padding-left: 32px;
    }
    .advice {
      margin: 0 0 4px 32px;
      font-weight: 500;
    }
    .caution {
      margin: 0 0 0 32px;
      font: var(--mat-sys-body-small);
    }
  `,
  // A live region that is always present, so a warning appearing while typing is announced.
  host: { role: 'status', 'aria-live': 'polite' },
})
export class PlanningCheckPanel {
  /** Warnings from `planningCheck` for one site; the panel is empty when there are none. */
  readonly warnings = input<readonly PlanningWarning[]>([]);
}
