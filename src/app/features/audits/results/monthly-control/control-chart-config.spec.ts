import { LIGHT_CHART_PALETTE } from '../chart-kit/chart-palette';
import { trendResult } from '../testing/results-fixtures';
import { buildCusumTable, buildPChartTable, buildXmrTable } from './control-tables';
import { CUSUM_POINT_STYLES, SIGNAL_DATASET, buildCusumChart } from './cusum-chart-config';
import { monthLabel } from './month-label';
import { CONTROL_LIMIT_DASH, INSIDE_POINT_STYLE, OUTSIDE_DATASET, OUTSIDE_POINT_STYLE, buildRelapsePChart } from './p-chart-config';
import { buildReboundXmrChart } from './xmr-chart-config';

const PALETTE = LIGHT_CHART_PALETTE;

describe('buildRelapsePChart', () => {
  const config = buildRelapsePChart(trendResult(), '6 months', PALETTE);
  const [share, outside, centre, upper, lower] = config.data.datasets;

  it('plots the monthly relapse share in percent against months of surgery', () => {
    expect(config.data.labels).toEqual(['Jan 2030', 'Feb 2030', 'Mar 2030']);
    expect(share.data).toEqual([10, 60, 16]);
    expect(centre.data).toEqual([20, 20, 20]);
  });

  it('draws per-month limits as stepped dashed lines', () => {
    expect(upper.data).toEqual([47, 47, 44]);
    expect(lower.data).toEqual([0, 0, 0]);
    expect(upper.stepped).toBe('middle');
    expect(upper.borderDash).toEqual(CONTROL_LIMIT_DASH);
    expect(centre.borderDash).toEqual([]);
  });

  it('flags the month outside its limits with another point style, size, colour and a label', () => {
    expect(share.pointStyle).toBe(INSIDE_POINT_STYLE);
    expect(outside.label).toBe('Outside the limits (diamond)');
    expect(outside.data).toEqual([null, 60, null]);
    expect(outside.showLine).toBe(false);
    expect(outside.pointStyle).toBe(OUTSIDE_POINT_STYLE);
    expect(INSIDE_POINT_STYLE).not.toBe(OUTSIDE_POINT_STYLE);
    expect(outside.pointRadius).toBeGreaterThan(Number(share.pointRadius));
    expect(outside.backgroundColor).toBe(PALETTE.coral);
    expect(config.options?.plugins?.tmPointLabels?.labels).toEqual([{ datasetIndex: OUTSIDE_DATASET, index: 1, text: 'outside the limits', colour: PALETTE.coral }]);
    expect(config.data.datasets[OUTSIDE_DATASET]).toBe(outside);
  });
});

describe('buildReboundXmrChart', () => {
  it('plots monthly mean rebound with its mean and constant process limits, outside months marked', () => {
    const config = buildReboundXmrChart(trendResult(), '6 months', PALETTE);
    const [values, outside, mean, upper, lower] = config.data.datasets;
    expect(values.data).toEqual([0.5, 1.3, 0.6]);
    expect(mean.label).toBe('Mean 0.60 mm');
    expect(upper.data).toEqual([1.1, 1.1, 1.1]);
    expect(lower.data).toEqual([0.1, 0.1, 0.1]);
    expect(upper.borderDash).toEqual(CONTROL_LIMIT_DASH);
    expect(outside.data).toEqual([null, 1.3, null]);
    expect(outside.pointStyle).toBe(OUTSIDE_POINT_STYLE);
  });
});

describe('buildCusumChart', () => {
  const config = buildCusumChart(trendResult(), PALETTE);
  const [cusum, complications, signals, limit] = config.data.datasets;

  it('plots the CUSUM in order of surgery with the decision limit h dashed', () => {
    expect(config.data.labels).toEqual(['2030-01-04', '2030-01-09', '2030-01-15', '2030-01-20']);
    expect(cusum.data).toEqual([0, 0.9, 2.1, 2.0]);
    expect(limit.label).toBe('Decision limit h = 2.00');
    expect(limit.data).toEqual([2, 2, 2, 2]);
    expect(limit.borderDash).toEqual(CONTROL_LIMIT_DASH);
  });

  it('marks complications and signals with their own point styles and labels the signal', () => {
    expect(cusum.pointRadius).toBe(0);
    expect(complications.data).toEqual([null, 0.9, null, null]);
    expect(complications.pointStyle).toBe(CUSUM_POINT_STYLES.complication);
    expect(signals.data).toEqual([null, null, 2.1, null]);
    expect(signals.pointStyle).toBe(CUSUM_POINT_STYLES.signal);
    expect(CUSUM_POINT_STYLES.complication).not.toBe(CUSUM_POINT_STYLES.signal);
    expect(config.data.datasets[SIGNAL_DATASET]).toBe(signals);
    expect(config.options?.plugins?.tmPointLabels?.labels).toEqual([{ datasetIndex: SIGNAL_DATASET, index: 2, text: 'signal: review', colour: PALETTE.coral }]);
  });
});

describe('control tables', () => {
  it('tabulate each view with the same numbers as its chart', () => {
    expect(buildPChartTable(trendResult(), '6 months').rows[1]).toEqual(['Feb 2030', '12', '20', '60.0%', '0.0 to 47.0', 'Yes']);
    expect(buildXmrTable(trendResult(), '6 months').caption).toContain('natural process limits 0.10 to 1.10 mm');
    expect(buildCusumTable(trendResult()).rows[2]).toEqual(['3', '2030-01-15', 'Yes', '2.10', 'Signal']);
  });

  it('reads months in words', () => {
    expect(monthLabel('2025-12')).toBe('Dec 2025');
    expect(monthLabel('2025-13')).toBe('2025-13');
  });
});
