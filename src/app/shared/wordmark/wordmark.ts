import { ChangeDetectionStrategy, Component } from '@angular/core';

/**
 * Tidemark's name with its glyph: two swells of tissue under a coral line,
 * the mark the margin is measured against. Drawn inline so no image is fetched.
 */
@Component({
  selector: 'tm-wordmark',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <svg class="glyph" viewBox="0 0 32 32" aria-hidden="true" focusable="false">
      <rect class="tile" width="32" height="32" rx="9" />
      <path class="mark" d="M7 11.5h18" />
      <path class="swell" d="M5 19.5c2.6-3 5.4-3 8 0s5.4 3 8 0 4.2-2.6 6-1.4" />
      <path class="swell swell-deep" d="M5 24.5c2.6-2.4 5.4-2.4 8 0s5.4 2.4 8 0 4.2-2 6-1" />
    </svg>
    <span class="name">Tidemark</span>
  `,
  styles: `
    :host {
      display: inline-flex;
      align-items: center;
      gap: 10px;
      color: inherit;
    }
    .glyph {
      width: 32px;
      height: 32px;
      flex: none;
    }
    .tile {
      fill: var(--mat-sys-primary);
    }
    .mark {
      stroke: var(--tm-attention-on-primary);
      stroke-width: 2.4;
      stroke-linecap: round;
    }
    .swell {
      fill: none;
      stroke: var(--mat-sys-on-primary);
      stroke-width: 2.2;
      stroke-linecap: round;
    }
    .swell-deep {
      opacity: 0.55;
    }
    .name {
      font: var(--mat-sys-title-large);
      font-weight: 600;
      letter-spacing: 0.01em;
    }
  `,
})
export class Wordmark {}
