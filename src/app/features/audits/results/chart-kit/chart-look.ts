import type { ChartPalette } from './chart-palette';

/** Axis colours from the palette, with the axis title spelled out (units included). */
export function scaleLook(palette: ChartPalette, title: string) {
  return {
    ticks: { color: palette.inkMuted },
    grid: { color: palette.grid },
    border: { color: palette.inkMuted },
    title: { display: title !== '', text: title, color: palette.ink },
  };
}

/** The canvas legend stays off: `ChartLegend` draws it in HTML from the same datasets (see legend-entries.ts). */
export const HIDDEN_LEGEND = { display: false } as const;

/** Tooltip on the inverse surface, readable in both schemes. */
export function tooltipLook(palette: ChartPalette) {
  return {
    backgroundColor: palette.ink,
    titleColor: palette.surface,
    bodyColor: palette.surface,
    footerColor: palette.surface,
    borderColor: palette.inkMuted,
    borderWidth: 1,
  };
}
