import { TestBed } from '@angular/core/testing';
import { caseDetailFixture } from '../testing/case-detail-fixture';
import { textOf } from '../testing/text-of';
import { SiteGrid } from './site-grid';

describe('SiteGrid', () => {
  async function render(detail = caseDetailFixture()): Promise<HTMLElement> {
    const fixture = TestBed.createComponent(SiteGrid);
    fixture.componentRef.setInput('sites', detail.sites);
    fixture.componentRef.setInput('visits', detail.visits);
    await fixture.whenStable();
    return fixture.nativeElement;
  }

  const text = textOf;

  it('runs the recall columns in schedule order after baseline, post-op and crown gain', async () => {
    const element = await render();
    const headers = [...element.querySelectorAll('thead th')].map(text);
    expect(headers).toEqual([
      'Site',
      'Baseline REF→GM, mm',
      'Post-op REF→GM, mm',
      'Crown gain mm',
      '6 weeks 16 Feb 2026',
      '3 months 6 Apr 2026',
    ]);
  });

  it("shows each site's readings with the rebound and class the server sent", async () => {
    const element = await render();
    const [tooth21, tooth22] = [...element.querySelectorAll('tbody tr')].map((row) => [...row.children].map(text));

    expect(tooth21?.slice(0, 4)).toEqual(['21 Mid-facial from incisal edge', '9.0 mm', '11.0 mm', '+2.0 mm']);
    // 0.5 mm would be "stable" by the default thresholds; the server said "minor", so the grid says "minor".
    expect(tooth21?.[4]).toBe('10.5 mm rebound +0.5 mm radio_button_partial minor');
    expect(tooth21?.[5]).toBe('9.5 mm rebound +1.5 mm warning relapse');

    expect(tooth22?.[4]).toBe('not measured');
    expect(tooth22?.[5]).toContain('rebound −0.5 mm');
    expect(tooth22?.[5]).toContain('stable');
    expect(tooth22?.[5]).toContain('review');
  });

  it('marks only the negative rebound for review, with an explanation for assistive technology', async () => {
    const element = await render();
    const flags = element.querySelectorAll('.flag');
    expect(flags).toHaveLength(1);
    expect(flags[0]?.getAttribute('aria-label')).toMatch(/^Flagged for review\. Negative rebound.*recession/);
    expect(flags[0]?.closest('tr')?.querySelector('.tooth')?.textContent).toBe('22');
  });

  it('says so when a case has no sites', async () => {
    const element = await render(caseDetailFixture({ sites: [], visits: [] }));
    expect(element.querySelector('table')).toBeNull();
    expect(text(element)).toBe('No sites are recorded for this case yet.');
  });
});
