import { DARK_CHART_PALETTE, LIGHT_CHART_PALETTE } from '../chart-kit/chart-palette';
import { SCHEDULE, auditResults, groupedResults } from '../testing/results-fixtures';
import { RELAPSE_THRESHOLD_DASH, STABLE_THRESHOLD_DASH, buildDriftChart, type DriftChartOptions } from './drift-chart-config';
import { buildDriftTable } from './drift-table';
import { referenceInterval } from './drift-series';

const OPTIONS: DriftChartOptions = { level: 'patient', showReference: false, showBands: true, highlightInterval: null, palette: LIGHT_CHART_PALETTE };

describe('buildDriftChart', () => {
  it('draws the patient-level mean with its 95% CI band over the scheduled intervals', () => {
    const config = buildDriftChart(auditResults(), OPTIONS);
    expect(config.type).toBe('line');
    expect(config.data.labels).toEqual(['6 weeks', '6 months', '12 months']);
    const [upper, lower, mean] = config.data.datasets;
    expect(mean.label).toBe('All cases: mean rebound');
    expect(mean.data).toEqual([0.35, 0.6, 0.75]);
    expect(upper.data.map((value) => (typeof value === 'number' ? value.toFixed(2) : value))).toEqual(['0.55', '0.80', '0.95']);
    expect(lower.data.map((value) => (typeof value === 'number' ? value.toFixed(2) : value))).toEqual(['0.15', '0.40', '0.55']);
    // The band is the area from the upper limit down to the next dataset (the lower limit).
    expect(upper.fill).toBe('+1');
    expect(mean.borderColor).toBe(LIGHT_CHART_PALETTE.teal);
    expect(config.options?.scales?.['y']?.title?.text).toBe('Mean rebound, mm (patient level)');
  });

  it('names the ungrouped line after the narrowed cohort, and subgroup lines after their groups', () => {
    const narrowed = buildDriftChart(auditResults(), { ...OPTIONS, cohortLabel: 'Thin (≤ 1 mm) · Wren Adeyemi' }).data.datasets;
    expect(narrowed[2].label).toBe('Thin (≤ 1 mm) · Wren Adeyemi: mean rebound');
    expect(narrowed.some((dataset) => dataset.label?.startsWith('All cases'))).toBe(false);
    const grouped = buildDriftChart(groupedResults(), { ...OPTIONS, cohortLabel: 'Thin (≤ 1 mm)' }).data.datasets;
    expect(grouped.filter((dataset) => dataset.label?.endsWith('mean rebound')).map((dataset) => dataset.label)).toEqual(['Thin: mean rebound', 'Thick: mean rebound']);
  });

  it('switches to site-level means', () => {
    const config = buildDriftChart(auditResults(), { ...OPTIONS, level: 'site' });
    expect(config.data.datasets[2].data).toEqual([0.3, 0.55, 0.7]);
    expect(config.options?.scales?.['y']?.title?.text).toBe('Mean rebound, mm (site level)');
  });

  it('leaves a gap where an interval has no mean or no CI', () => {
    const results = auditResults();
    const summary = { ...results.summary, intervals: results.summary.intervals.filter((interval) => interval.intervalKey !== '12m') };
    const config = buildDriftChart({ ...results, summary }, OPTIONS);
    expect(config.data.datasets[2].data[2]).toBeNull();
    expect(config.data.datasets[0].data[2]).toBeNull();
  });

  it('draws the stability thresholds as dashed lines with different dashes', () => {
    const datasets = buildDriftChart(auditResults(), OPTIONS).data.datasets;
    const stable = datasets.find((dataset) => dataset.label?.startsWith('Stable'));
    const relapse = datasets.find((dataset) => dataset.label?.startsWith('Relapse'));
    expect(stable?.label).toBe('Stable: rebound at or below 0.5 mm');
    expect(stable?.data).toEqual([0.5, 0.5, 0.5]);
    expect(stable?.borderDash).toEqual(STABLE_THRESHOLD_DASH);
    expect(relapse?.data).toEqual([1, 1, 1]);
    expect(relapse?.borderDash).toEqual(RELAPSE_THRESHOLD_DASH);
    expect(relapse?.borderColor).toBe(LIGHT_CHART_PALETTE.coral);
    expect(STABLE_THRESHOLD_DASH).not.toEqual(RELAPSE_THRESHOLD_DASH);
  });

  it('draws one line per subgroup, each with its own colour, dash and point style', () => {
    const datasets = buildDriftChart(groupedResults(), OPTIONS).data.datasets;
    const means = datasets.filter((dataset) => dataset.label?.endsWith('mean rebound'));
    expect(means.map((dataset) => dataset.label)).toEqual(['Thin: mean rebound', 'Thick: mean rebound']);
    expect(means[1].data).toEqual([0.55, 0.95, 1.2]);
    expect(means[0].borderColor).not.toBe(means[1].borderColor);
    expect(means[0].borderDash).not.toEqual(means[1].borderDash);
    expect(means[0].pointStyle).not.toBe(means[1].pointStyle);
    expect(datasets.filter((dataset) => dataset.label?.endsWith('95% CI'))).toHaveLength(2);
  });

  it('overlays the published reference at 6 months as mean ± SD, naming the source in the legend', () => {
    expect(buildDriftChart(auditResults(), OPTIONS).data.datasets.some((dataset) => dataset.label?.startsWith('Published'))).toBe(false);
    const datasets = buildDriftChart(auditResults(), { ...OPTIONS, showReference: true }).data.datasets;
    const reference = datasets.at(-1);
    expect(reference?.label).toBe('Published: Arora et al., J Periodontol 2013;84:934–940, 0.77 ± 0.58 mm (mean ± SD) at 6 months');
    expect(reference?.data).toEqual([
      { x: '6 months', y: 0.77 },
      { x: '6 months', y: 0.77 - 0.58 },
      { x: '6 months', y: 0.77 + 0.58 },
    ]);
    expect(reference?.pointStyle).toEqual(['rectRot', 'dash', 'dash']);
  });

  it('leaves the reference out when no interval falls near 6 months', () => {
    const schedule = [SCHEDULE[0]];
    const config = buildDriftChart(auditResults({ schedule }), { ...OPTIONS, showReference: true });
    expect(config.data.datasets.some((dataset) => dataset.label?.startsWith('Published'))).toBe(false);
    expect(referenceInterval([{ ...SCHEDULE[1], key: 'half-year', targetDays: 180 }])?.key).toBe('half-year');
  });

  it('leaves the CI bands out when asked, keeping one line per series', () => {
    const datasets = buildDriftChart(groupedResults(), { ...OPTIONS, showBands: false }).data.datasets;
    expect(datasets.some((dataset) => dataset.label?.endsWith('95% CI') || dataset.label === '')).toBe(false);
    expect(datasets.filter((dataset) => dataset.label?.endsWith('mean rebound'))).toHaveLength(2);
  });

  it('enlarges the point of the interval chosen in the filters', () => {
    const mean = buildDriftChart(auditResults(), { ...OPTIONS, highlightInterval: '12m' }).data.datasets[2];
    expect(mean.pointRadius).toEqual([4, 4, 7]);
  });

  it('takes every colour from the palette in use, never Chart.js defaults', () => {
    const config = buildDriftChart(auditResults(), { ...OPTIONS, palette: DARK_CHART_PALETTE });
    expect(config.data.datasets[2].borderColor).toBe(DARK_CHART_PALETTE.teal);
    expect(config.options?.scales?.['y']?.ticks?.color).toBe(DARK_CHART_PALETTE.inkMuted);
    expect(config.options?.scales?.['x']?.grid?.color).toBe(DARK_CHART_PALETTE.grid);
  });

  it('leaves the legend to the HTML legend and keeps the lower CI limit unlabelled', () => {
    const config = buildDriftChart(auditResults(), OPTIONS);
    expect(config.options?.plugins?.legend?.display).toBe(false);
    expect(config.data.datasets[1].label).toBe('');
  });
});

describe('buildDriftTable', () => {
  it('lists every interval with n sites, n patients, mean and CI at the chosen level', () => {
    const table = buildDriftTable(auditResults(), 'patient');
    expect(table.columns).toEqual(['Interval', 'n sites', 'n patients', 'Mean rebound, mm (patient level)', '95% CI, mm']);
    expect(table.rows[1]).toEqual(['6 months', '40', '10', '0.60 mm', '0.40 to 0.80']);
  });

  it('adds a group column and one row per group and interval when grouped', () => {
    const table = buildDriftTable(groupedResults(), 'site');
    expect(table.columns[0]).toBe('Group');
    expect(table.rows).toHaveLength(6);
    expect(table.rows[5]).toEqual(['Thick', '12 months', '40', '10', '1.10 mm', '1.00 to 1.20']);
  });
});
