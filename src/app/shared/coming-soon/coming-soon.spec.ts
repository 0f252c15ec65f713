import { TestBed } from '@angular/core/testing';
import { ComingSoon } from './coming-soon';

describe('ComingSoon', () => {
  it('shows the page name, its purpose and the release that brings it', async () => {
    const fixture = TestBed.createComponent(ComingSoon);
    fixture.componentRef.setInput('heading', 'Audits');
    fixture.componentRef.setInput('purpose', 'Audits will hold each audit.');
    fixture.componentRef.setInput('release', 'Arrives with the audits release.');
    await fixture.whenStable();

    const element: HTMLElement = fixture.nativeElement;
    expect(element.querySelector('h1')?.textContent?.trim()).toBe('Audits');
    expect(element.textContent).toContain('Audits will hold each audit.');
    expect(element.textContent).toContain('Arrives with the audits release.');
    expect(element.querySelector('table, canvas')).toBeNull();
  });
});
