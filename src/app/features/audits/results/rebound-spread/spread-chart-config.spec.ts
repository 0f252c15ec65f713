import { LIGHT_CHART_PALETTE } from '../chart-kit/chart-palette';
import { auditResults } from '../testing/results-fixtures';
import { binClass, buildSpreadChart, buildSpreadTable } from './spread-chart-config';

const THRESHOLDS = { stable: 0.5, relapse: 1 };

describe('binClass', () => {
  it('gives each 0.5 mm bin the class of the rebounds it holds (upper edge included)', () => {
    expect(binClass({ from: -0.5, to: 0 }, THRESHOLDS)).toBe('stable');
    expect(binClass({ from: 0, to: 0.5 }, THRESHOLDS)).toBe('stable');
    expect(binClass({ from: 0.5, to: 1 }, THRESHOLDS)).toBe('minor');
    expect(binClass({ from: 1, to: 1.5 }, THRESHOLDS)).toBe('relapse');
  });

  it('calls a bin that a custom threshold cuts through mixed', () => {
    expect(binClass({ from: 0.5, to: 1 }, { stable: 0.75, relapse: 1 })).toBe('mixed');
  });
});

describe('buildSpreadChart', () => {
  const config = buildSpreadChart(auditResults(), { intervalKey: '6m', palette: LIGHT_CHART_PALETTE });

  it('labels bins by their edges and puts each count in its class dataset only', () => {
    expect(config.type).toBe('bar');
    expect(config.data.labels).toEqual(['−0.5 to 0.0', '0.0 to 0.5', '0.5 to 1.0', '1.0 to 1.5', '1.5 to 2.0']);
    const [stable, minor, relapse] = config.data.datasets;
    expect(stable.data).toEqual([2, 18, null, null, null]);
    expect(minor.data).toEqual([null, null, 12, null, null]);
    expect(relapse.data).toEqual([null, null, null, 6, 2]);
    expect(config.data.datasets).toHaveLength(3);
  });

  it('names the rule and the pattern in the legend, not just a colour', () => {
    expect(config.data.datasets.map((dataset) => dataset.label)).toEqual([
      'Stable, at or below 0.5 mm (plain)',
      'Minor, above 0.5 to 1.0 mm (striped)',
      'Relapse, above 1.0 mm (cross-hatched)',
    ]);
  });

  it('asks the pattern plugin for a different pattern per class, in our colours', () => {
    const fills = config.options?.plugins?.tmPatterns?.fills ?? [];
    expect(fills.map((fill) => fill?.kind)).toEqual(['solid', 'diagonal', 'cross']);
    expect(fills.map((fill) => fill?.colour)).toEqual([LIGHT_CHART_PALETTE.teal, LIGHT_CHART_PALETTE.sand, LIGHT_CHART_PALETTE.coral]);
  });

  it('stacks the class datasets so each bin is one full-width bar', () => {
    expect(config.options?.scales?.['x']?.stacked).toBe(true);
    expect(config.options?.scales?.['y']?.stacked).toBe(true);
    expect(config.data.datasets[0].barPercentage).toBe(1);
  });

  it('adds a dotted dataset only when a bin spans a threshold', () => {
    const mixed = buildSpreadChart(auditResults({ thresholds: { stable: 0.75, relapse: 1 } }), { intervalKey: '6m', palette: LIGHT_CHART_PALETTE });
    expect(mixed.data.datasets.at(-1)?.label).toBe('Bin spans a threshold (dotted)');
    expect(mixed.options?.plugins?.tmPatterns?.fills?.at(-1)?.kind).toBe('dots');
  });

  it('draws nothing for an interval without a histogram', () => {
    const empty = buildSpreadChart(auditResults(), { intervalKey: '3y', palette: LIGHT_CHART_PALETTE });
    expect(empty.data.labels).toEqual([]);
  });
});

describe('buildSpreadTable', () => {
  it('gives bin, class, sites and share', () => {
    const table = buildSpreadTable(auditResults(), '6m');
    expect(table.caption).toContain('6 months');
    expect(table.rows[2]).toEqual(['0.5 to 1.0', 'Minor', '12', '30.0%']);
    expect(table.rows).toHaveLength(5);
  });
});
