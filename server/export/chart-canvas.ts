import { createRequire } from 'node:module';
import { createCanvas, GlobalFonts } from '@napi-rs/canvas';
import {
  BarController,
  BarElement,
  CategoryScale,
  Chart,
  Legend,
  LinearScale,
  LineController,
  LineElement,
  PointElement,
  ScatterController,
  Title,
  type Plugin,
} from 'chart.js';
import { CHART_FONT_FAMILY, CHART_PALETTE } from './chart-palette';

/** Only the pieces the three governance charts use (STYLE.md: register what you use). */
Chart.register(BarController, BarElement, LineController, LineElement, PointElement, ScatterController, CategoryScale, LinearScale, Legend, Title);

let areFontsLoaded = false;

/** Registers Work Sans from @fontsource once; the canvas falls back to a system font if it cannot. */
function loadFonts(): void {
  if (areFontsLoaded) return;
  areFontsLoaded = true;
  const require = createRequire(import.meta.url);
  for (const weight of ['400', '600']) {
    GlobalFonts.registerFromPath(require.resolve(`@fontsource/work-sans/files/work-sans-latin-${weight}-normal.woff2`), 'Work Sans');
  }
}

/** Paints the background white: a transparent PNG shows as black in some viewers. */
const paperBackground: Plugin = {
  id: 'tidemarkPaper',
  beforeDraw: (chart) => {
    const context = chart.ctx;
    context.save();
    context.fillStyle = CHART_PALETTE.paper;
    context.fillRect(0, 0, chart.width, chart.height);
    context.restore();
  },
};
Chart.register(paperBackground);

/** Size of a rendered chart in pixels (1 px = 1 CSS px; the workbook shows it at 96 dpi). */
export interface ChartSize {
  width: number;
  height: number;
}

/** Options every server-side chart needs: a fixed size, no animation, one device pixel per CSS pixel. */
export const STATIC_CHART_OPTIONS = { responsive: false, animation: false, devicePixelRatio: 1 } as const;

/** The 2-D context a chart draws on. */
export type ChartContext = ReturnType<ReturnType<typeof createCanvas>['getContext']>;

/**
 * Renders one chart to PNG bytes on a server-side canvas (@napi-rs/canvas). `draw` builds the
 * chart on the context it is given (with {@link STATIC_CHART_OPTIONS} in its options), so each
 * chart keeps its own precise chart.js types.
 */
export function renderChartPng(size: ChartSize, draw: (context: ChartContext) => Chart): Buffer {
  loadFonts();
  Chart.defaults.font.family = CHART_FONT_FAMILY;
  Chart.defaults.color = CHART_PALETTE.ink;
  const canvas = createCanvas(size.width, size.height);
  const chart = draw(canvas.getContext('2d'));
  try {
    return canvas.toBuffer('image/png');
  } finally {
    chart.destroy();
  }
}
