import type { Chart, Plugin } from 'chart.js';

/**
 * Width, in CSS pixels, a chart is redrawn at for paper: an A4 page in portrait less 12 mm
 * margins is about 700 px wide. Drawn at this width its text keeps its size on paper; a screen
 * drawing shrunk to the page would print its labels at two-thirds size or less.
 */
export const PRINT_WIDTH_PX = 680;

/** Plot height on paper, px: low enough that two charts with their captions share an A4 page. */
export const PRINT_HEIGHT_PX = 250;

const charts = new Set<Chart>();

/** Chart.js does not resize for print by itself; its documentation asks for an explicit size before printing and a reset after. */
function redrawForPaper(): void {
  for (const chart of charts) chart.resize(PRINT_WIDTH_PX, Math.min(chart.height, PRINT_HEIGHT_PX));
}

function redrawForScreen(): void {
  for (const chart of charts) chart.resize();
}

let isListening = false;

/** Redraws every Results chart at {@link PRINT_WIDTH_PX} × {@link PRINT_HEIGHT_PX} at most while the page prints, and at its box's size afterwards. */
export const printSizePlugin: Plugin = {
  id: 'tmPrintSize',
  install(chart) {
    charts.add(chart);
    if (!isListening && typeof window !== 'undefined') {
      window.addEventListener('beforeprint', redrawForPaper);
      window.addEventListener('afterprint', redrawForScreen);
      isListening = true;
    }
  },
  uninstall(chart) {
    charts.delete(chart);
  },
};
