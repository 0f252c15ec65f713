/**
 * The only Chart.js parts the Results charts use, registered through ng2-charts. This file
 * (and so Chart.js itself) is reached only from the deferred charts block of the Results
 * board, which keeps Chart.js out of the initial bundle (STACK-NOTES gotcha 7).
 */
import {
  BarController,
  BarElement,
  CategoryScale,
  Filler,
  Legend,
  LineController,
  LineElement,
  LinearScale,
  PointElement,
  Tooltip,
  type ChartComponentLike,
} from 'chart.js';
import { provideCharts } from 'ng2-charts';
import { patternFillPlugin } from './pattern-fill-plugin';
import { printSizePlugin } from './print-size-plugin';
import { barLabelPlugin, pointLabelPlugin } from './value-label-plugins';

/** Line and bar charts on category and linear axes, with bands, legend, tooltips and our four plugins. */
export const RESULTS_CHART_PARTS: readonly ChartComponentLike[] = [
  LineController,
  BarController,
  LineElement,
  PointElement,
  BarElement,
  CategoryScale,
  LinearScale,
  Filler,
  Legend,
  Tooltip,
  patternFillPlugin,
  barLabelPlugin,
  pointLabelPlugin,
  printSizePlugin,
];

/** Providers for any component with a `baseChart` canvas in the Results area. */
export function provideResultsCharts() {
  const isMotionReduced = typeof matchMedia === 'function' && matchMedia('(prefers-reduced-motion: reduce)').matches;
  return provideCharts({
    registerables: RESULTS_CHART_PARTS,
    defaults: {
      font: { family: "'Work Sans', system-ui, sans-serif", size: 12 },
      maintainAspectRatio: false,
      animation: isMotionReduced ? false : { duration: 300 },
    },
  });
}
