import { DARK_CHART_PALETTE, LIGHT_CHART_PALETTE } from '../chart-kit/chart-palette';
import { survivalResult } from '../testing/results-fixtures';
import { MEDIAN_DASH, buildSurvivalChart, buildSurvivalTable } from './survival-chart-config';

describe('buildSurvivalChart', () => {
  const config = buildSurvivalChart(survivalResult(), LIGHT_CHART_PALETTE);
  const [upper, lower, curve] = config.data.datasets;

  it('draws the Kaplan–Meier curve as steps that drop at each event time, from 100% at day 0', () => {
    // 'before': horizontal to the next event time, then down (Chart.js _steppedLineTo).
    expect(curve.stepped).toBe('before');
    expect(curve.data).toEqual([
      { x: 0, y: 100 },
      { x: 30, y: 97.5 },
      { x: 90, y: 91 },
    ]);
    expect(curve.label).toBe('Sites free of relapse (rebound above 1.0 mm)');
    expect(config.options?.scales?.['x']?.type).toBe('linear');
  });

  it('draws the 95% CI as a stepped band between the limits', () => {
    expect(upper.fill).toBe('+1');
    expect(upper.stepped).toBe('before');
    expect(upper.data.map((point) => point.y)).toEqual([100, 99, 96]);
    expect(lower.data.map((point) => point.y)).toEqual([100, 90, 80]);
    expect(upper.backgroundColor).toBe(LIGHT_CHART_PALETTE.tealBand);
  });

  it('leaves a gap where the CI is not estimable', () => {
    const result = survivalResult();
    const steps = [...result.curve.steps, { time: 120, atRisk: 1, events: 1, survival: 0, lower: null, upper: null }];
    const config = buildSurvivalChart({ ...result, curve: { ...result.curve, steps } }, LIGHT_CHART_PALETTE);
    expect(config.data.datasets[0].data.at(-1)).toEqual({ x: 120, y: null });
  });

  it('adds dashed median guide lines only when the median is reached', () => {
    expect(config.data.datasets.some((dataset) => dataset.label?.startsWith('Median'))).toBe(false);
    const reached = buildSurvivalChart(survivalResult(200), DARK_CHART_PALETTE);
    const median = reached.data.datasets.at(-1);
    expect(median?.label).toBe('Median time to relapse: 200 days');
    expect(median?.data).toEqual([
      { x: 0, y: 50 },
      { x: 200, y: 50 },
      { x: 200, y: 0 },
    ]);
    expect(median?.borderDash).toEqual(MEDIAN_DASH);
    expect(median?.borderColor).toBe(DARK_CHART_PALETTE.coral);
  });
});

describe('buildSurvivalTable', () => {
  it('lists each event time with sites at risk, relapses and the estimate with its CI', () => {
    const table = buildSurvivalTable(survivalResult());
    expect(table.rows).toEqual([
      ['30', '40', '1', '97.5%', '90.0 to 99.0%'],
      ['90', '30', '2', '91.0%', '80.0 to 96.0%'],
    ]);
    expect(table.caption).toContain('censored at their last recall');
  });
});
