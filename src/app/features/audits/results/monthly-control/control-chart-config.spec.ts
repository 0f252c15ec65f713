import { LIGHT_CHART_PALETTE } from '../chart-kit/chart-palette';
import { trendResult } from '../testing/results-fixtures';
import { buildCusumTable, buildPChartTable, buildXmrTable } from './control-tables';
import { CUSUM_POINT_STYLES, SIGNAL_DATASET, buildCusumChart } from './cusum-chart-config';
import { CONTROL_LIMIT_DASH, INSIDE_POINT_STYLE, OUTSIDE_DATASET, OUTSIDE_POINT_STYLE, buildRelapsePChart } from './p-chart-config';
import { buildReboundXmrChart } from './xmr-chart-config';

const PALETTE = LIGHT_CHART_PALETTE;
/** The product's own locale, as the app falls back to it (core/locale/user-locale.ts). */
const LOCALE = 'en-GB';

describe('buildRelapsePChart', () => {
  const config = buildRelapsePChart(trendResult(), '6 months', PALETTE, LOCALE);
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
    const config = buildReboundXmrChart(trendResult(), '6 months', PALETTE, LOCALE);
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
    expect(buildPChartTable(trendResult(), '6 months', LOCALE).rows[1]).toEqual(['Feb 2030', '12', '20', '60.0%', '0.0 to 47.0', 'Yes']);
    expect(buildXmrTable(trendResult(), '6 months', LOCALE).caption).toContain('natural process limits 0.10 to 1.10 mm');
    expect(buildCusumTable(trendResult()).rows[2]).toEqual(['3', '2030-01-15', 'Yes', '2.10', 'Signal']);
  });
});

describe('month names in the person’s locale', () => {
  // The expected names come from Intl.DateTimeFormat itself (ECMA-402, CLDR data through the ICU
  // the tests run on), asked for a short month and the year of each fixture month, shown in UTC.
  const monthsIn = (locale: string) =>
    [0, 1, 2].map((month) => new Intl.DateTimeFormat(locale, { month: 'short', year: 'numeric', timeZone: 'UTC' }).format(new Date(Date.UTC(2030, month, 1))));

  it('names months on both control charts’ axes and in their tables in German for de-DE', () => {
    const german = monthsIn('de-DE');
    // The German names differ from the English ones, so month names fixed in English fail the checks below.
    expect(german).not.toEqual(monthsIn('en-GB'));
    expect(german[2]).toContain('März');
    expect(buildRelapsePChart(trendResult(), '6 months', PALETTE, 'de-DE').data.labels).toEqual(german);
    expect(buildReboundXmrChart(trendResult(), '6 months', PALETTE, 'de-DE').data.labels).toEqual(german);
    expect(buildPChartTable(trendResult(), '6 months', 'de-DE').rows.map((row) => row[0])).toEqual(german);
    expect(buildXmrTable(trendResult(), '6 months', 'de-DE').rows.map((row) => row[0])).toEqual(german);
  });

  it('keeps British English for the product’s own locale', () => {
    expect(buildPChartTable(trendResult(), '6 months', LOCALE).rows.map((row) => row[0])).toEqual(monthsIn('en-GB'));
    expect(monthsIn('en-GB')).toEqual(['Jan 2030', 'Feb 2030', 'Mar 2030']);
  });
});
