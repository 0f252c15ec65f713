import { Pipe, PipeTransform } from '@angular/core';

/** Shown where a reading is missing. */
export const NO_READING = '—';

/**
 * A distance in millimetres with one decimal, the way probes are read and reported
 * (DESIGN.md §3): `1.5 mm`. With `'signed'` a plus or a true minus sign leads, for
 * differences such as rebound (`+0.5 mm`, `−0.5 mm`). Null shows a dash.
 */
@Pipe({ name: 'millimetres' })
export class MillimetresPipe implements PipeTransform {
  transform(value: number | null | undefined, style: 'plain' | 'signed' = 'plain'): string {
    if (value === null || value === undefined || !Number.isFinite(value)) {
      return NO_READING;
    }
    // Round first so −0.04 reads as 0.0, not −0.0.
    const rounded = Math.round(value * 10) / 10;
    const magnitude = Math.abs(rounded).toFixed(1);
    if (rounded < 0) {
      return `−${magnitude} mm`;
    }
    return style === 'signed' && rounded > 0 ? `+${magnitude} mm` : `${magnitude} mm`;
  }
}
