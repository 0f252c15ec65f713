import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import type { FigureTable } from './figure-table';
import { ResultsFigure } from './results-figure';

const TABLE: FigureTable = {
  caption: 'Sites by rebound at 6 months.',
  columns: ['Rebound, mm', 'Sites'],
  rows: [
    ['0.0 to 0.5', '18'],
    ['0.5 to 1.0', '12'],
  ],
};

@Component({
  imports: [ResultsFigure],
  template: `
    <tm-results-figure heading="Rebound spread" counts="40 sites · 10 patients" [table]="table()">
      <span tmFigureNote>Site rebound at 6 months.</span>
      <canvas aria-label="chart"></canvas>
    </tm-results-figure>
  `,
})
class FigureHost {
  readonly table = signal(TABLE);
}

describe('ResultsFigure', () => {
  async function render() {
    const fixture = TestBed.createComponent(FigureHost);
    await fixture.whenStable();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const element: HTMLElement = fixture.nativeElement;
    return { fixture, element, toggle: await loader.getHarness(MatButtonHarness.with({ text: /the numbers/ })) };
  }

  it('is a figure whose caption starts with the title, then counts, the toggle and the caution', async () => {
    const { element } = await render();
    const caption = element.querySelector('figure > figcaption');
    expect(caption?.firstElementChild?.textContent?.trim()).toBe('Rebound spread');
    expect(caption?.querySelector('.counts')?.textContent).toBe('40 sites · 10 patients');
    expect(caption?.querySelector('button')?.textContent).toContain('Show the numbers');
    expect(caption?.querySelector('.caution')?.textContent).toContain('not a diagnostic tool');
    expect(element.querySelector('figure .chart-area canvas')).not.toBeNull();
  });

  it('reveals the numbers as a table and hides them again', async () => {
    const { fixture, element, toggle } = await render();
    expect(element.querySelector('table')).toBeNull();
    expect(await (await toggle.host()).getAttribute('aria-expanded')).toBe('false');

    await toggle.click();
    await fixture.whenStable();
    const table = element.querySelector('table');
    expect(table?.querySelector('caption')?.textContent).toBe('Sites by rebound at 6 months.');
    expect([...(table?.querySelectorAll('thead th') ?? [])].map((cell) => cell.getAttribute('scope'))).toEqual(['col', 'col']);
    const rows = [...(table?.querySelectorAll('tbody tr') ?? [])];
    expect(rows.map((row) => row.querySelector('th[scope="row"]')?.textContent)).toEqual(['0.0 to 0.5', '0.5 to 1.0']);
    expect(rows[1].querySelector('td')?.textContent).toBe('12');
    expect(await toggle.getText()).toContain('Hide the numbers');
    expect(await (await toggle.host()).getAttribute('aria-expanded')).toBe('true');
    const controlled = await (await toggle.host()).getAttribute('aria-controls');
    expect(controlled && element.querySelector(`#${controlled}`)?.contains(table ?? null)).toBe(true);

    await toggle.click();
    await fixture.whenStable();
    expect(element.querySelector('table')).toBeNull();
    expect(await toggle.getText()).toContain('Show the numbers');
  });

  it('follows new data while the numbers are shown', async () => {
    const { fixture, element, toggle } = await render();
    await toggle.click();
    fixture.componentInstance.table.set({ ...TABLE, rows: [['1.0 to 1.5', '6']] });
    await fixture.whenStable();
    expect(element.querySelectorAll('tbody tr')).toHaveLength(1);
    expect(element.querySelector('tbody th')?.textContent).toBe('1.0 to 1.5');
  });
});
