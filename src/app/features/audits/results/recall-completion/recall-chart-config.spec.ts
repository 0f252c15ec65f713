import { LIGHT_CHART_PALETTE } from '../chart-kit/chart-palette';
import { outcomeSummary } from '../testing/results-fixtures';
import { buildRecallChart, buildRecallTable } from './recall-chart-config';

describe('buildRecallChart', () => {
  const recall = outcomeSummary().recall;
  const config = buildRecallChart(recall, LIGHT_CHART_PALETTE);

  it('stacks seen in window, seen late, missed and pending per interval', () => {
    expect(config.type).toBe('bar');
    expect(config.data.labels).toEqual(['6 weeks', '6 months', '12 months']);
    expect(config.data.datasets.map((dataset) => dataset.label)).toEqual([
      'Seen in window (plain)',
      'Seen late (striped)',
      'Missed (cross-hatched)',
      'Window open, not seen yet (dotted)',
    ]);
    expect(config.data.datasets[0].data).toEqual([8, 7, 6]);
    expect(config.options?.scales?.['y']?.stacked).toBe(true);
  });

  it('gives every state a different pattern', () => {
    const kinds = config.options?.plugins?.tmPatterns?.fills?.map((fill) => fill?.kind);
    expect(kinds).toEqual(['solid', 'diagonal', 'cross', 'open']);
  });

  it('adds early visits only when there are some', () => {
    const intervals = recall.intervals.map((interval, i) => (i === 1 ? { ...interval, seenEarly: 2 } : interval));
    const early = buildRecallChart({ ...recall, intervals }, LIGHT_CHART_PALETTE);
    expect(early.data.datasets[1].label).toBe('Seen early (vertical lines)');
    expect(early.data.datasets[1].data).toEqual([0, 2, 0]);
    expect(early.options?.plugins?.tmPatterns?.fills?.[1]?.kind).toBe('vertical');
  });
});

describe('buildRecallTable', () => {
  it('gives every count and the completion with its interval', () => {
    const table = buildRecallTable(outcomeSummary().recall);
    expect(table.caption).toContain('12 cases, 1 withdrawn');
    expect(table.rows[0]).toEqual(['6 weeks', '11', '8', '0', '1', '1', '1', '0', '90.0% (80.0 to 100.0%)']);
  });
});
