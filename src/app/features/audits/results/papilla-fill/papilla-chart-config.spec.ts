import { DARK_CHART_PALETTE, LIGHT_CHART_PALETTE } from '../chart-kit/chart-palette';
import { auditResults } from '../testing/results-fixtures';
import { PAPILLA_SCORES, buildPapillaChart, buildPapillaTable } from './papilla-chart-config';

describe('buildPapillaChart', () => {
  const config = buildPapillaChart(auditResults(), LIGHT_CHART_PALETTE);

  it('stacks one dataset per papilla score over the intervals, as percentages', () => {
    expect(config.type).toBe('bar');
    expect(config.data.labels).toEqual(['6 weeks', '6 months', '12 months']);
    expect(config.data.datasets.map((dataset) => dataset.label)).toEqual([...PAPILLA_SCORES]);
    // Fixture: 0, 2, 4, 10, 4 of 20 scored sites.
    expect(config.data.datasets.map((dataset) => dataset.data[1])).toEqual([0, 10, 20, 50, 20]);
    expect(config.options?.scales?.['y']?.stacked).toBe(true);
    expect(config.options?.scales?.['y']?.max).toBe(100);
  });

  it('writes each score and share inside its segment, in an ink that reads on that fill', () => {
    const labels = config.options?.plugins?.tmBarLabels;
    expect(labels?.display).toBe(true);
    expect(labels?.format).toBe('percent');
    // Named in words, so no segment is told apart by its colour alone (DESIGN.md §8).
    expect(labels?.names).toEqual(['Score 0', 'Score 1', 'Score 2', 'Score 3', 'Score 4']);
    expect(labels?.inks).toEqual(['#fff8f1', '#1e1b15', '#1e1b15', '#1e1b15', '#fff8f1']);
  });

  it('colours scores from the palette of the scheme in use', () => {
    const dark = buildPapillaChart(auditResults(), DARK_CHART_PALETTE);
    expect(dark.data.datasets.map((dataset) => dataset.backgroundColor)).toEqual([...DARK_CHART_PALETTE.papilla]);
  });

  it('leaves an interval without scored sites empty rather than zero', () => {
    const results = auditResults();
    const intervals = results.summary.intervals.map((interval) =>
      interval.intervalKey === '12m' ? { ...interval, papilla: { ...interval.papilla, distribution: interval.papilla.distribution.map((entry) => ({ ...entry, estimate: { count: 0, n: 0, p: null, lower: null, upper: null } })) } } : interval,
    );
    const empty = buildPapillaChart({ ...results, summary: { ...results.summary, intervals } }, LIGHT_CHART_PALETTE);
    expect(empty.data.datasets[3].data).toEqual([50, 50, null]);
  });
});

describe('buildPapillaTable', () => {
  it('gives shares with counts per score and the mean change from baseline', () => {
    const table = buildPapillaTable(auditResults());
    expect(table.columns).toEqual(['Interval', 'Scored sites', 'Patients', 'Score 0', 'Score 1', 'Score 2', 'Score 3', 'Score 4', 'Mean change from baseline, score points']);
    expect(table.rows[0]).toEqual(['6 weeks', '20', '8', '0.0% (0)', '10.0% (2)', '20.0% (4)', '50.0% (10)', '20.0% (4)', '0.50']);
  });
});
