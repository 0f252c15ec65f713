import { LIGHT_CHART_PALETTE } from './chart-palette';
import { legendEntries, markerShape } from './legend-entries';
import { buildDriftChart } from '../margin-drift/drift-chart-config';
import { buildFunnelChart } from '../operator-funnel/funnel-chart-config';
import { buildSpreadChart } from '../rebound-spread/spread-chart-config';
import { auditResults, funnelResult, groupedResults } from '../testing/results-fixtures';

const PALETTE = LIGHT_CHART_PALETTE;

describe('legendEntries', () => {
  it('shows lines with their dash and marker, bands as bands, and skips unlabelled parts', () => {
    const entries = legendEntries(buildDriftChart(groupedResults(), { level: 'patient', showReference: true, showBands: true, highlightInterval: null, palette: PALETTE }));
    expect(entries.map((entry) => [entry.label, entry.swatch])).toEqual([
      ['Thin: 95% CI', 'band'],
      ['Thin: mean rebound', 'line'],
      ['Thick: 95% CI', 'band'],
      ['Thick: mean rebound', 'line'],
      ['Stable: rebound at or below 0.5 mm', 'line'],
      ['Relapse: rebound above 1.0 mm', 'line'],
      ['Published: Arora et al., J Periodontol 2013;84:934–940, 0.77 ± 0.58 mm (mean ± SD) at 6 months', 'line'],
    ]);
    const [, thin, , thick, stable] = entries;
    expect([thin.marker, thick.marker]).toEqual(['circle', 'triangle']);
    expect(thick.dash).toEqual([8, 4]);
    expect(stable.marker).toBeNull();
    expect(stable.dash).toEqual([10, 5]);
    expect(entries.at(-1)?.marker).toBe('rectRot');
  });

  it('takes bar fills and patterns from the pattern plugin options', () => {
    const entries = legendEntries(buildSpreadChart(auditResults(), { intervalKey: '6m', palette: PALETTE }));
    expect(entries.map((entry) => [entry.swatch, entry.pattern, entry.fill])).toEqual([
      ['bar', 'solid', PALETTE.teal],
      ['bar', 'diagonal', PALETTE.sand],
      ['bar', 'cross', PALETTE.coral],
    ]);
    expect(entries[1].patternInk).toBe(PALETTE.sandHatch);
  });

  it('shows points-only datasets as their markers', () => {
    const entries = legendEntries(buildFunnelChart(funnelResult(), { intervalLabel: null, palette: PALETTE })).slice(-3);
    expect(entries.map((entry) => [entry.swatch, entry.marker, entry.fill])).toEqual([
      ['marker', 'circle', PALETTE.teal],
      ['marker', 'triangle', PALETTE.coral],
      ['marker', 'rectRot', PALETTE.coral],
    ]);
  });
});

describe('markerShape', () => {
  it('draws each point style differently', () => {
    const shapes = (['circle', 'triangle', 'rect', 'rectRot', 'crossRot', 'star'] as const).map((style) => JSON.stringify(markerShape(style)));
    expect(new Set(shapes).size).toBe(6);
  });
});
