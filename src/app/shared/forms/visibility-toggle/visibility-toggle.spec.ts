import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { VisibilityToggle } from './visibility-toggle';

@Component({
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [VisibilityToggle],
  template: `<input [type]="shown() ? 'text' : 'password'" /><tm-visibility-toggle [(shown)]="shown" what="passwords" />`,
})
class Host {
  readonly shown = signal(false);
}

describe('VisibilityToggle', () => {
  it('names what it shows or hides, says whether it is pressed, and flips the bound signal', async () => {
    const fixture = TestBed.createComponent(Host);
    await fixture.whenStable();
    const button: HTMLButtonElement = fixture.nativeElement.querySelector('button');
    const field: HTMLInputElement = fixture.nativeElement.querySelector('input');
    expect([button.getAttribute('aria-label'), button.getAttribute('aria-pressed'), field.type]).toEqual(['Show passwords', 'false', 'password']);

    button.click();
    await fixture.whenStable();
    expect(fixture.componentInstance.shown()).toBe(true);
    expect([button.getAttribute('aria-label'), button.getAttribute('aria-pressed'), field.type]).toEqual(['Hide passwords', 'true', 'text']);

    button.click();
    await fixture.whenStable();
    expect([button.getAttribute('aria-label'), field.type]).toEqual(['Show passwords', 'password']);
  });
});
