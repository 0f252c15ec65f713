/**
 * Chart colours from Tidemark's own palette (src/theme/_theme-colors.scss): sea-glass teal,
 * warm sand, coral for attention. Canvas cannot resolve the theme's `light-dark()` custom
 * properties, so both schemes are spelled out here from the same tonal values.
 */
export interface ChartPalette {
  readonly scheme: 'light' | 'dark';
  /** Text on the chart surface. */
  readonly ink: string;
  /** Secondary text and axis lines. */
  readonly inkMuted: string;
  readonly grid: string;
  /** The page surface, used behind labels drawn over lines. */
  readonly surface: string;
  readonly teal: string;
  /** Translucent teal for confidence bands. */
  readonly tealBand: string;
  readonly sand: string;
  /** Outline of sand areas and markers. */
  readonly sandInk: string;
  /** Hatching drawn over sand (dark on light sand in both schemes). */
  readonly sandHatch: string;
  readonly coral: string;
  readonly coralBand: string;
  /** Warm neutral for reference lines (practice rate, centre, stable threshold), apart from the teal series. */
  readonly slate: string;
  /** Subgroup lines, in order; each also gets its own dash pattern and point style. */
  readonly series: readonly string[];
  /** Papilla scores 0–4 (Jemt 1997), from no papilla to full fill and beyond. */
  readonly papilla: readonly [string, string, string, string, string];
}

/** Light scheme: tones 40–60 on a near-white sand surface. */
export const LIGHT_CHART_PALETTE: ChartPalette = {
  scheme: 'light',
  ink: '#1e1b15',
  inkMuted: '#4a463e',
  grid: 'rgba(30, 27, 21, 0.12)',
  surface: '#fff8f1',
  teal: '#0a6a64',
  tealBand: 'rgba(10, 106, 100, 0.16)',
  sand: '#d4bf94',
  sandInk: '#6e5d3a',
  sandHatch: '#6e5d3a',
  coral: '#bf5843',
  coralBand: 'rgba(191, 88, 67, 0.14)',
  slate: '#625e55',
  series: ['#0a6a64', '#bf5843', '#8a7344', '#3c5854', '#31837c', '#802918'],
  papilla: ['#9f402d', '#df9a72', '#d4bf94', '#4f9d96', '#00504b'],
};

/** Dark scheme: tones 70–90 on the dark sand surface. */
export const DARK_CHART_PALETTE: ChartPalette = {
  scheme: 'dark',
  ink: '#e9e1d6',
  inkMuted: '#cdc6bb',
  grid: 'rgba(233, 225, 214, 0.16)',
  surface: '#16130d',
  teal: '#86d4cc',
  tealBand: 'rgba(134, 212, 204, 0.2)',
  sand: '#d9c9a6',
  sandInk: '#f5ede1',
  sandHatch: '#4a3d22',
  coral: '#ff8a72',
  coralBand: 'rgba(255, 138, 114, 0.18)',
  slate: '#cdc6bb',
  series: ['#86d4cc', '#ff8a72', '#e3cf9f', '#aecdc8', '#a2f1e8', '#ffb4a5'],
  papilla: ['#ff8a72', '#f2b48f', '#d9c9a6', '#6ab9b1', '#a2f1e8'],
};

/** The palette for the scheme in use. */
export function chartPalette(isDark: boolean): ChartPalette {
  return isDark ? DARK_CHART_PALETTE : LIGHT_CHART_PALETTE;
}

/** Dash patterns (px) that tell subgroup lines apart without colour. */
export const SERIES_DASHES: readonly (readonly number[])[] = [[], [8, 4], [2, 3], [10, 3, 2, 3], [4, 4], [12, 6]];

/** Point styles that tell subgroup lines apart without colour. */
export const SERIES_POINT_STYLES = ['circle', 'triangle', 'rect', 'rectRot', 'star', 'crossRot'] as const;

/** A `#rrggbb` colour with an alpha, as `rgba()`; anything else is returned unchanged. */
export function withAlpha(colour: string, alpha: number): string {
  const match = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(colour);
  if (!match) return colour;
  const [red, green, blue] = match.slice(1).map((hex) => parseInt(hex, 16));
  return `rgba(${red}, ${green}, ${blue}, ${alpha})`;
}

/** Dark or light text for writing on `colour` (`#rrggbb`), whichever contrasts more (WCAG relative luminance). */
export function readableInk(colour: string, dark = '#1e1b15', light = '#fff8f1'): string {
  const match = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(colour);
  if (!match) return dark;
  const [red, green, blue] = match.slice(1).map((hex) => {
    const channel = parseInt(hex, 16) / 255;
    return channel <= 0.03928 ? channel / 12.92 : ((channel + 0.055) / 1.055) ** 2.4;
  });
  const luminance = 0.2126 * red + 0.7152 * green + 0.0722 * blue;
  // Contrast with black text is (L + 0.05) / 0.05, with white 1.05 / (L + 0.05); they are equal near L = 0.179.
  return luminance > 0.179 ? dark : light;
}
