import { Chart } from 'chart.js';
import { complicationFunnelChartConfig } from './complication-funnel-chart';
import { renderChartPng, type ChartSize } from './chart-canvas';
import type { GovernancePack } from './governance-pack';
import { marginDriftChartConfig } from './margin-drift-chart';
import { recallCompletionChartConfig } from './recall-completion-chart';

/** A rendered chart with the words that go with it. */
export interface RenderedChart {
  title: string;
  /** Alternative text and caption: what the picture shows, without needing to see it. */
  description: string;
  png: Buffer;
  size: ChartSize;
}

/** Every chart is drawn at this size (shown at 96 dpi in the workbook). */
export const CHART_SIZE: ChartSize = { width: 880, height: 440 };

/** The three key charts of the pack: margin drift, the complications funnel and recall completion. */
export function renderGovernanceCharts(pack: GovernancePack): RenderedChart[] {
  const { summary, thresholds } = pack.results;
  const drift = marginDriftChartConfig(summary, thresholds);
  const funnel = complicationFunnelChartConfig(pack.complicationFunnel);
  const recall = recallCompletionChartConfig(summary.recall);
  return [
    {
      title: 'Margin drift',
      description: 'Mean rebound per site (mm) at each recall interval with its 95% confidence interval, the patient-level mean, and the relapse threshold. Figures: Margin outcomes sheet, "All cases" rows.',
      png: renderChartPng(CHART_SIZE, (context) => new Chart(context, drift)),
      size: CHART_SIZE,
    },
    {
      title: 'Complications funnel',
      description: 'Share of cases with a complication per operator (letters) against the number of cases, with 95% and 99.8% limits around the practice rate. Figures: Complications sheet, "By operator" rows.',
      png: renderChartPng(CHART_SIZE, (context) => new Chart(context, funnel)),
      size: CHART_SIZE,
    },
    {
      title: 'Recall completion',
      description: 'Cases per recall interval seen in window, seen early or late, missed and still pending, with the completion share. Figures: Recall sheet.',
      png: renderChartPng(CHART_SIZE, (context) => new Chart(context, recall)),
      size: CHART_SIZE,
    },
  ];
}
