/**
 * Options of Tidemark's own Chart.js plugins, declared on Chart.js's option types so chart
 * configurations stay fully typed. Types only: importing this file costs the bundle nothing.
 */
import type { ChartType } from 'chart.js';

/** How a filled area is told apart besides its colour (DESIGN.md §8: never colour alone). */
export type PatternKind = 'solid' | 'diagonal' | 'cross' | 'dots' | 'vertical' | 'open';

/** A fill: base colour, the ink its pattern is drawn in, and the pattern. */
export interface PatternFill {
  readonly colour: string;
  readonly ink: string;
  readonly kind: PatternKind;
}

/** `options.plugins.tmPatterns`: fills by dataset index (null leaves the dataset's own colour). */
export interface PatternFillOptions {
  readonly fills: readonly (PatternFill | null)[];
}

/** `options.plugins.tmBarLabels`: values written inside bar segments. */
export interface BarLabelOptions {
  readonly display: boolean;
  readonly format: 'count' | 'percent';
  /** Text colour per dataset index, chosen to read on that dataset's fill. */
  readonly inks: readonly string[];
  /** Segments shorter than this many pixels stay unlabelled. */
  readonly minHeight: number;
  /**
   * Short name per dataset index (e.g. "Score 2"), written with the value where the segment has
   * room, so a segment is named in words and never by its colour alone.
   */
  readonly names?: readonly string[];
}

/** One text label beside a data point. */
export interface PointLabel {
  readonly datasetIndex: number;
  readonly index: number;
  readonly text: string;
  readonly colour: string;
}

/** `options.plugins.tmPointLabels`: words written next to chosen points (operators, signals). */
export interface PointLabelOptions {
  readonly labels: readonly PointLabel[];
  /** Colour of the halo drawn behind each label so it reads over lines. */
  readonly halo: string;
}

declare module 'chart.js' {
  interface PluginOptionsByType<TType extends ChartType> {
    tmPatterns: PatternFillOptions;
    tmBarLabels: BarLabelOptions;
    tmPointLabels: PointLabelOptions;
  }
}
