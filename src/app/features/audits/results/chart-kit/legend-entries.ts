import type { PointStyle } from 'chart.js';
import type { PatternFill, PatternKind } from './chart-extensions';

/** One entry of a chart's legend, drawn in HTML beside the canvas so dashes, markers and patterns show as they are drawn. */
export interface LegendEntry {
  readonly label: string;
  /** What the swatch shows: a line (with its dash and marker), a CI band, a patterned bar, or a marker alone. */
  readonly swatch: 'line' | 'band' | 'bar' | 'marker';
  readonly stroke: string;
  readonly fill: string;
  readonly dash: readonly number[];
  readonly marker: PointStyle | null;
  readonly pattern: PatternKind | null;
  readonly patternInk: string;
}

/** The dataset properties a legend entry is read from (Chart.js datasets satisfy it). */
interface LegendSource {
  readonly label?: string;
  readonly borderColor?: unknown;
  readonly backgroundColor?: unknown;
  readonly borderDash?: unknown;
  readonly borderWidth?: unknown;
  readonly pointStyle?: unknown;
  readonly pointRadius?: unknown;
  readonly pointBackgroundColor?: unknown;
  readonly showLine?: unknown;
}

/** The parts of a chart configuration the legend needs. */
export interface LegendConfiguration {
  readonly type: 'line' | 'bar';
  readonly data: { readonly datasets: readonly LegendSource[] };
  readonly options?: { readonly plugins?: { readonly tmPatterns?: { readonly fills?: readonly (Partial<PatternFill> | null | undefined)[] } } };
}

const POINT_STYLES: readonly PointStyle[] = ['circle', 'cross', 'crossRot', 'dash', 'line', 'rect', 'rectRounded', 'rectRot', 'star', 'triangle'];

/** Legend entries for every labelled dataset, in dataset order (datasets labelled '' are parts of another entry). */
export function legendEntries(config: LegendConfiguration): LegendEntry[] {
  const fills = config.options?.plugins?.tmPatterns?.fills ?? [];
  return config.data.datasets.flatMap((dataset, index): LegendEntry[] => {
    if (!dataset.label) return [];
    const stroke = colourOf(dataset.borderColor);
    const fill = colourOf(dataset.backgroundColor) || stroke;
    const base = { label: dataset.label, stroke, fill, dash: dashOf(dataset.borderDash), marker: null, pattern: null, patternInk: stroke };
    if (config.type === 'bar') {
      const pattern = fills[index];
      return [{ ...base, swatch: 'bar', fill: pattern?.colour ?? fill, pattern: pattern?.kind ?? null, patternInk: pattern?.ink ?? stroke }];
    }
    if (dataset.borderWidth === 0) return [{ ...base, swatch: 'band' }];
    const marker = hasPoints(dataset.pointRadius) ? (styleOf(dataset.pointStyle) ?? 'circle') : null;
    const markerFill = colourOf(dataset.pointBackgroundColor) || fill;
    if (dataset.showLine === false) return [{ ...base, swatch: 'marker', marker, fill: markerFill }];
    return [{ ...base, swatch: 'line', marker, fill: markerFill }];
  });
}

/** A marker as SVG geometry centred on (18, 8) in a 36 × 16 swatch. */
export type MarkerShape =
  | { readonly kind: 'circle' }
  | { readonly kind: 'polygon'; readonly points: string }
  | { readonly kind: 'lines'; readonly lines: readonly (readonly [number, number, number, number])[] };

/** SVG geometry for a Chart.js point style. */
export function markerShape(style: PointStyle): MarkerShape {
  switch (style) {
    case 'triangle':
      return { kind: 'polygon', points: '18,2.5 23.5,12.5 12.5,12.5' };
    case 'rect':
    case 'rectRounded':
      return { kind: 'polygon', points: '13.5,3.5 22.5,3.5 22.5,12.5 13.5,12.5' };
    case 'rectRot':
      return { kind: 'polygon', points: '18,2 24,8 18,14 12,8' };
    case 'cross':
      return { kind: 'lines', lines: [[18, 3, 18, 13], [13, 8, 23, 8]] };
    case 'crossRot':
      return { kind: 'lines', lines: [[14, 4, 22, 12], [14, 12, 22, 4]] };
    case 'star':
      return { kind: 'lines', lines: [[18, 3, 18, 13], [13, 8, 23, 8], [14.5, 4.5, 21.5, 11.5], [14.5, 11.5, 21.5, 4.5]] };
    case 'dash':
    case 'line':
      return { kind: 'lines', lines: [[12, 8, 24, 8]] };
    default:
      return { kind: 'circle' };
  }
}

function first(value: unknown): unknown {
  return Array.isArray(value) ? value[0] : value;
}

function colourOf(value: unknown): string {
  const colour = first(value);
  return typeof colour === 'string' ? colour : '';
}

function dashOf(value: unknown): number[] {
  return Array.isArray(value) ? value.filter((part): part is number => typeof part === 'number') : [];
}

function styleOf(value: unknown): PointStyle | null {
  const style = first(value);
  return POINT_STYLES.find((known) => known === style) ?? null;
}

/** Chart.js draws points unless every radius is 0 (its default radius is 3). */
function hasPoints(radius: unknown): boolean {
  if (radius === undefined) return true;
  if (Array.isArray(radius)) return radius.some((value) => typeof value === 'number' && value > 0);
  return typeof radius === 'number' && radius > 0;
}
