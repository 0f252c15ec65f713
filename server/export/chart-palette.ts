/**
 * Tidemark's chart colours (DESIGN.md §8: sea-glass teal, warm sand, coral for what needs
 * attention). Every chart also says what it shows in words, line styles and point shapes,
 * so no reading depends on hue alone.
 */
export const CHART_PALETTE = {
  teal: '#2f7f7a',
  tealLight: '#a9d3cf',
  sand: '#d9c7a3',
  sandDark: '#9c8454',
  coral: '#e0735e',
  coralLight: '#f3c2b7',
  ink: '#23313a',
  mist: '#c9d1d4',
  grid: '#e6e9ea',
  paper: '#ffffff',
} as const;

/** The font the app ships (Work Sans from npm), with a system fallback for the canvas. */
export const CHART_FONT_FAMILY = "'Work Sans', 'DejaVu Sans', sans-serif";
