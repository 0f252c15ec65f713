import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';

/** One arch as drawn: two quadrants side by side, the patient's right on the viewer's left. */
interface ArchLayout {
  readonly name: string;
  readonly quadrants: readonly [QuadrantLayout, QuadrantLayout];
  /** Upper arch rises towards the molars and the lower arch falls, so the two read as an open mouth. */
  readonly curve: 1 | -1;
}

interface QuadrantLayout {
  readonly name: string;
  /** FDI numbers in drawing order (ISO 3950). */
  readonly teeth: readonly number[];
}

const range = (quadrant: number, order: 'towards-midline' | 'from-midline'): number[] => {
  const teeth = [1, 2, 3, 4, 5, 6, 7, 8].map((position) => quadrant * 10 + position);
  return order === 'towards-midline' ? teeth.reverse() : teeth;
};

/** The permanent dentition, in the order the picker draws it. */
export const PERMANENT_ARCHES: readonly ArchLayout[] = [
  {
    name: 'Upper arch',
    curve: -1,
    quadrants: [
      { name: 'Upper right (quadrant 1)', teeth: range(1, 'towards-midline') },
      { name: 'Upper left (quadrant 2)', teeth: range(2, 'from-midline') },
    ],
  },
  {
    name: 'Lower arch',
    curve: 1,
    quadrants: [
      { name: 'Lower right (quadrant 4)', teeth: range(4, 'towards-midline') },
      { name: 'Lower left (quadrant 3)', teeth: range(3, 'from-midline') },
    ],
  },
];

/** Short tooth kind for the screen-reader name ("11, central incisor"). */
const TOOTH_KINDS = ['central incisor', 'lateral incisor', 'canine', 'first premolar', 'second premolar', 'first molar', 'second molar', 'third molar'];

/**
 * Picks teeth by FDI number (ISO 3950): two arches of toggle buttons, each saying whether it
 * is chosen with `aria-pressed`, a tick and a filled face — never colour alone. Presentational:
 * it shows `selected` and reports each press through `toggled`.
 */
@Component({
  selector: 'tm-tooth-picker',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  templateUrl: './tooth-picker.html',
  styleUrl: './tooth-picker.scss',
})
export class ToothPicker {
  /** FDI numbers currently chosen. */
  readonly selected = input<readonly number[]>([]);
  /** Accessible name of the whole picker. */
  readonly label = input('Teeth treated');
  /** Emits the FDI number of a tooth that was pressed. */
  readonly toggled = output<number>();

  protected readonly arches = PERMANENT_ARCHES;
  private readonly selectedSet = computed(() => new Set(this.selected()));

  protected isSelected(tooth: number): boolean {
    return this.selectedSet().has(tooth);
  }

  protected toothName(tooth: number): string {
    return `${tooth}, ${TOOTH_KINDS[(tooth % 10) - 1] ?? 'tooth'}`;
  }

  /** Vertical offset in px: grows towards the molars so each row follows an arch. */
  protected archOffset(tooth: number, curve: 1 | -1): number {
    const fromMidline = (tooth % 10) - 1;
    return Math.round(curve * fromMidline * fromMidline * 0.45);
  }

  protected toggle(tooth: number): void {
    this.toggled.emit(tooth);
  }
}
