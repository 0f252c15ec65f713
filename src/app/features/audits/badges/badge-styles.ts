/**
 * The pill every audit badge wears: icon and word side by side, so a state never rests on
 * colour alone (DESIGN.md §8). Tones: `calm` (teal container), `attention` (coral container),
 * `quiet` (outline only).
 */
export const BADGE_STYLES = `
  :host {
    display: inline-flex;
    align-items: center;
    gap: 6px;
    padding: 3px 12px 3px 8px;
    border-radius: var(--mat-sys-corner-full);
    font: var(--mat-sys-label-large);
    white-space: nowrap;
    background: var(--mat-sys-secondary-container);
    color: var(--mat-sys-on-secondary-container);
  }
  :host(.attention) {
    background: var(--tm-attention-container);
    color: var(--tm-on-attention-container);
  }
  :host(.quiet) {
    background: transparent;
    color: var(--mat-sys-on-surface);
    box-shadow: inset 0 0 0 1px var(--mat-sys-outline);
  }
  mat-icon {
    width: 20px;
    height: 20px;
    font-size: 20px;
  }
`;

/** The look of one state: Material Symbols ligature, word and tone. */
export interface BadgeLook {
  readonly icon: string;
  readonly word: string;
  readonly tone: 'calm' | 'attention' | 'quiet';
}
