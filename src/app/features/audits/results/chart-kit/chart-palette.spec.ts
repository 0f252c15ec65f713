import { DARK_CHART_PALETTE, LIGHT_CHART_PALETTE, SERIES_DASHES, SERIES_POINT_STYLES, chartPalette, readableInk, withAlpha } from './chart-palette';

describe('chart palette', () => {
  it('picks the dark palette for the dark scheme', () => {
    expect(chartPalette(true)).toBe(DARK_CHART_PALETTE);
    expect(chartPalette(false)).toBe(LIGHT_CHART_PALETTE);
  });

  it('uses our teal, sand and coral rather than Chart.js defaults', () => {
    const chartJsDefaults = ['rgba(0,0,0,0.1)', '#36a2eb', '#ff6384', '#4bc0c0', '#ff9f40', '#9966ff', '#ffcd56', '#c9cbcf'];
    for (const palette of [LIGHT_CHART_PALETTE, DARK_CHART_PALETTE]) {
      const colours = [palette.teal, palette.sand, palette.coral, ...palette.series, ...palette.papilla].map((colour) => colour.toLowerCase());
      expect(colours.filter((colour) => chartJsDefaults.includes(colour))).toEqual([]);
    }
    expect(LIGHT_CHART_PALETTE.teal).not.toBe(DARK_CHART_PALETTE.teal);
  });

  it('gives each subgroup series its own dash and point style as well as a hue', () => {
    expect(new Set(SERIES_DASHES.map((dash) => dash.join(','))).size).toBe(SERIES_DASHES.length);
    expect(new Set(SERIES_POINT_STYLES).size).toBe(SERIES_POINT_STYLES.length);
    expect(LIGHT_CHART_PALETTE.series.length).toBe(SERIES_DASHES.length);
  });

  it('adds an alpha to hex colours only', () => {
    expect(withAlpha('#0a6a64', 0.2)).toBe('rgba(10, 106, 100, 0.2)');
    expect(withAlpha('rgba(1, 2, 3, 0.5)', 0.2)).toBe('rgba(1, 2, 3, 0.5)');
  });
});

describe('readableInk', () => {
  it('writes dark on light fills and light on dark fills', () => {
    expect(readableInk('#d4bf94')).toBe('#1e1b15');
    expect(readableInk('#00504b')).toBe('#fff8f1');
    expect(readableInk('#ffffff', 'black', 'white')).toBe('black');
  });
});
