import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { Component, signal } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import type { AuditResults, FunnelResult, SurvivalResult, TrendResult } from '@tidemark/shared';
import { Chart } from 'chart.js';
import { DARK_CHART_PALETTE, LIGHT_CHART_PALETTE } from '../chart-kit/chart-palette';
import type { Loaded } from '../results-load';
import { auditResults, funnelResult, groupedResults, survivalResult, trendResult } from '../testing/results-fixtures';
import { ResultsCharts } from './results-charts';

function ready<T>(value: T): Loaded<T> {
  return { status: 'ready', value, failure: null };
}

@Component({
  imports: [ResultsCharts],
  template: `
    <tm-results-charts
      [results]="results()"
      [funnel]="funnel()"
      [trend]="trend()"
      [survival]="survival()"
      [intervalKey]="intervalKey()"
      [palette]="palette()"
    />
  `,
})
class ChartsHost {
  readonly results = signal<AuditResults>(auditResults());
  readonly funnel = signal<Loaded<FunnelResult>>(ready(funnelResult()));
  readonly trend = signal<Loaded<TrendResult>>(ready(trendResult()));
  readonly survival = signal<Loaded<SurvivalResult>>(ready(survivalResult()));
  readonly intervalKey = signal<string | null>('6m');
  readonly palette = signal(LIGHT_CHART_PALETTE);
}

/**
 * jsdom has no canvas: a context that accepts every drawing call lets Chart.js build real
 * chart instances, so the specs can count them.
 */
function drawingContext(canvas: HTMLCanvasElement): object {
  return new Proxy(
    { canvas },
    {
      get(target, property) {
        if (property === 'canvas') return target.canvas;
        // Not array-like and not a promise: Chart.js and Angular probe for both.
        if (typeof property === 'symbol' || property === 'length' || property === 'then' || /^\d+$/.test(property)) return undefined;
        if (property === 'measureText') return (text: string) => ({ width: text.length * 6, actualBoundingBoxAscent: 9, actualBoundingBoxDescent: 3 });
        if (property === 'getLineDash') return () => [];
        return () => undefined;
      },
      set: () => true,
    },
  );
}

describe('ResultsCharts', () => {
  const original = Object.getOwnPropertyDescriptor(HTMLCanvasElement.prototype, 'getContext');
  let fixture: ComponentFixture<ChartsHost>;

  beforeEach(async () => {
    Object.defineProperty(HTMLCanvasElement.prototype, 'getContext', {
      configurable: true,
      value(this: HTMLCanvasElement) {
        return drawingContext(this);
      },
    });
    vi.stubGlobal(
      'ResizeObserver',
      class {
        observe(): void {}
        unobserve(): void {}
        disconnect(): void {}
      },
    );
    fixture = TestBed.createComponent(ChartsHost);
    await fixture.whenStable();
  });

  afterEach(() => {
    if (original) Object.defineProperty(HTMLCanvasElement.prototype, 'getContext', original);
    vi.unstubAllGlobals();
  });

  function liveCharts(): number {
    return Object.keys(Chart.instances).length;
  }

  function chartOf(title: string): Chart | undefined {
    const figure = [...fixture.nativeElement.querySelectorAll('figure')].find((found: Element) => found.querySelector('h3')?.textContent === title);
    const canvas = figure?.querySelector('canvas');
    return canvas ? Chart.getChart(canvas) : undefined;
  }

  it('shows every chart as a titled figure, in reading order', () => {
    const titles = [...fixture.nativeElement.querySelectorAll('figure figcaption h3')].map((heading: Element) => heading.textContent);
    expect(titles).toEqual([
      'Margin drift by interval',
      'Rebound spread',
      'Papilla fill by interval',
      'Complications by operator',
      'Monthly relapse control',
      'Recall completion',
      'Time to relapse',
    ]);
    expect(liveCharts()).toBe(7);
    expect(chartOf('Complications by operator')?.data.datasets.map((dataset) => dataset.label)).toContain('Operator within the 95% limits (circle)');
  });

  it('updates the same charts when filters, scope or scheme change, instead of piling up new ones', async () => {
    const drift = chartOf('Margin drift by interval');
    fixture.componentInstance.results.set(groupedResults());
    fixture.componentInstance.funnel.set({ status: 'loading', value: funnelResult({ measure: 'relapse' }), failure: null });
    fixture.componentInstance.intervalKey.set('12m');
    fixture.componentInstance.palette.set(DARK_CHART_PALETTE);
    await fixture.whenStable();

    expect(liveCharts()).toBe(7);
    expect(chartOf('Margin drift by interval')).toBe(drift);
    expect(drift?.data.datasets.map((dataset) => dataset.label)).toContain('Thick: mean rebound');
    expect(drift?.data.datasets.find((dataset) => dataset.label === 'Thin: mean rebound')?.borderColor).toBe(DARK_CHART_PALETTE.series[0]);
  });

  it('destroys a chart whose data went away and every chart with the component', async () => {
    fixture.componentInstance.funnel.set({ status: 'failed', value: null, failure: 'Tidemark can’t reach the server.' });
    await fixture.whenStable();
    expect(liveCharts()).toBe(6);
    expect(fixture.nativeElement.textContent).toContain('Tidemark can’t reach the server.');

    fixture.destroy();
    expect(liveCharts()).toBe(0);
  });

  it('reveals a chart’s numbers from its own toggle', async () => {
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const toggles = await loader.getAllHarnesses(MatButtonHarness.with({ text: /Show the numbers/ }));
    expect(toggles).toHaveLength(7);
    await toggles[5].click();
    await fixture.whenStable();
    const table = fixture.nativeElement.querySelector('table');
    expect(table?.querySelector('caption')?.textContent).toContain('Recalls per interval');
    expect(table?.querySelectorAll('tbody tr')).toHaveLength(3);
    expect(await toggles[5].getText()).toContain('Hide the numbers');
  });
});
