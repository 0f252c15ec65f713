import { LIGHT_CHART_PALETTE } from '../chart-kit/chart-palette';
import { funnelResult } from '../testing/results-fixtures';
import { FIRST_OPERATOR_DATASET, LIMIT_95_DASH, LIMIT_998_DASH, buildFunnelChart, buildFunnelTable, funnelPointSentence } from './funnel-chart-config';

const OPTIONS = { intervalLabel: null, palette: LIGHT_CHART_PALETTE };

describe('buildFunnelChart', () => {
  const config = buildFunnelChart(funnelResult(), OPTIONS);
  const byLabel = (label: string) => config.data.datasets.find((dataset) => dataset.label === label);

  it('draws the practice rate as the target line across the plot', () => {
    const target = byLabel('Practice rate 10.0%');
    expect(target?.data).toEqual([
      { x: 0, y: 10 },
      { x: 20, y: 10 },
    ]);
    expect(target?.borderDash).toEqual([]);
  });

  it('draws the 95% and 99.8% limit curves in two different dash patterns', () => {
    const upper95 = byLabel('95% limits');
    const upper998 = byLabel('99.8% limits');
    expect(upper95?.data).toEqual([
      { x: 1, y: 80 },
      { x: 10, y: 30 },
      { x: 20, y: 25 },
    ]);
    expect(upper998?.data.at(-1)).toEqual({ x: 20, y: 32 });
    expect(upper95?.borderDash).toEqual(LIMIT_95_DASH);
    expect(upper998?.borderDash).toEqual(LIMIT_998_DASH);
    expect(LIMIT_95_DASH).not.toEqual(LIMIT_998_DASH);
    // The lower curves share the style but stay out of the legend.
    expect(config.data.datasets.filter((dataset) => dataset.label === '').map((dataset) => dataset.borderDash)).toEqual([LIMIT_95_DASH, LIMIT_998_DASH]);
  });

  it('places operators at (n, rate), those beyond a limit in their own dataset with another marker and colour', () => {
    const [inside, beyond95, beyond998] = config.data.datasets.slice(FIRST_OPERATOR_DATASET);
    expect(inside.label).toBe('Operator within the 95% limits (circle)');
    expect(inside.data).toEqual([
      { x: 20, y: 5 },
      { x: 20, y: 10 },
    ]);
    expect(beyond95.label).toBe('Beyond a 95% limit (triangle)');
    expect(beyond95.data).toEqual([{ x: 20, y: 30 }]);
    expect(beyond998.data).toEqual([]);
    expect([inside.pointStyle, beyond95.pointStyle, beyond998.pointStyle]).toEqual(['circle', 'triangle', 'rectRot']);
    expect([inside.showLine, beyond95.showLine]).toEqual([false, false]);
    expect([inside.backgroundColor, beyond95.backgroundColor]).toEqual([LIGHT_CHART_PALETTE.teal, LIGHT_CHART_PALETTE.coral]);
    // The signed-in operator ("Me (you)", second inside) carries a dark ring.
    expect(inside.pointBorderColor).toEqual([LIGHT_CHART_PALETTE.surface, LIGHT_CHART_PALETTE.ink]);
  });

  it('labels every operator beside its own point and says in words which is beyond a limit', () => {
    const labels = config.options?.plugins?.tmPointLabels?.labels ?? [];
    expect(labels.map((label) => [label?.datasetIndex, label?.index, label?.text])).toEqual([
      [FIRST_OPERATOR_DATASET, 0, 'Operator A'],
      [FIRST_OPERATOR_DATASET, 1, 'Me (you)'],
      [FIRST_OPERATOR_DATASET + 1, 0, 'Operator B: above the 95% limit'],
    ]);
    expect(labels[2]?.colour).toBe(LIGHT_CHART_PALETTE.coral);
  });

  it('puts points beyond the 99.8% limit, high or low, in the diamond dataset', () => {
    const result = funnelResult();
    const alarmed = buildFunnelChart({ ...result, points: [{ ...result.points[1], position: 'alarm-low' }] }, OPTIONS);
    expect(alarmed.data.datasets[FIRST_OPERATOR_DATASET + 2].data).toEqual([{ x: 20, y: 30 }]);
    expect(alarmed.data.datasets[FIRST_OPERATOR_DATASET].data).toEqual([]);
  });

  it('names the axes for the measure shown', () => {
    expect(config.options?.scales?.['x']?.title?.text).toBe('Cases operated (n)');
    const relapse = buildFunnelChart(funnelResult({ measure: 'relapse', intervalKey: '6m' }), { ...OPTIONS, intervalLabel: '6 months' });
    expect(relapse.options?.scales?.['y']?.title?.text).toBe('Sites in relapse at 6 months, %');
  });

  it('keeps the rate axis short of the near-certain limits at tiny n', () => {
    expect(config.options?.scales?.['y']?.max).toBe(40);
  });
});

describe('funnel numbers', () => {
  it('describes one operator in a sentence', () => {
    expect(funnelPointSentence(funnelResult().points[1])).toBe('Operator B: 6 of 20 (30.0%), above the 95% limit');
  });

  it('tabulates events, n, rate, both limits and the position', () => {
    const table = buildFunnelTable(funnelResult(), null);
    expect(table.caption).toBe('Cases with a complication per operator against the practice rate of 10.0% (9 of 60).');
    expect(table.rows[1]).toEqual(['Operator B', '6', '20', '30.0%', '0.0 to 25.0', '0.0 to 32.0', 'above the 95% limit']);
  });
});
