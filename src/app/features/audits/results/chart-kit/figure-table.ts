/** The numbers behind a chart, as an accessible table (first column heads each row). */
export interface FigureTable {
  readonly caption: string;
  readonly columns: readonly string[];
  readonly rows: readonly (readonly string[])[];
}

/** Short caution on every figure; the full DESIGN.md §7 text closes the Results area. */
export const FIGURE_CAUTION = 'For clinical audit and quality improvement only: not a diagnostic tool.';
