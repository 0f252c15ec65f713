import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { ToothPickerHarness } from './testing/tooth-picker-harness';
import { ToothPicker } from './tooth-picker';

@Component({
  selector: 'tm-picker-host',
  imports: [ToothPicker],
  template: `<tm-tooth-picker [selected]="teeth()" (toggled)="toggle($event)" />`,
})
class PickerHost {
  readonly teeth = signal<number[]>([]);
  toggle(tooth: number): void {
    this.teeth.update((teeth) => (teeth.includes(tooth) ? teeth.filter((each) => each !== tooth) : [...teeth, tooth]));
  }
}

describe('ToothPicker', () => {
  async function setUp() {
    const fixture = TestBed.createComponent(PickerHost);
    const picker = await TestbedHarnessEnvironment.loader(fixture).getHarness(ToothPickerHarness);
    return { host: fixture.componentInstance, picker };
  }

  it('draws both arches in FDI order, patient right on the viewer left (ISO 3950)', async () => {
    const { picker } = await setUp();
    expect(await picker.getTeeth()).toEqual([
      18, 17, 16, 15, 14, 13, 12, 11, 21, 22, 23, 24, 25, 26, 27, 28,
      48, 47, 46, 45, 44, 43, 42, 41, 31, 32, 33, 34, 35, 36, 37, 38,
    ]);
    expect(await picker.getName(13)).toBe('13, canine');
  });

  it('toggles a tooth and says so with aria-pressed', async () => {
    const { host, picker } = await setUp();
    expect(await picker.getPressed(21)).toBe('false');

    await picker.toggle(21);
    expect(host.teeth()).toEqual([21]);
    expect(await picker.getPressed(21)).toBe('true');
    expect(await picker.getSelectedTeeth()).toEqual([21]);

    await picker.toggle(36);
    expect(await picker.getSelectedTeeth()).toEqual([21, 36]);

    await picker.toggle(21);
    expect(await picker.getPressed(21)).toBe('false');
    expect(await picker.getSelectedTeeth()).toEqual([36]);
  });

  it('uses real buttons, so every tooth is reachable with Tab and pressed with Enter or Space', async () => {
    const fixture = TestBed.createComponent(PickerHost);
    await fixture.whenStable();
    const buttons: HTMLButtonElement[] = Array.from(fixture.nativeElement.querySelectorAll('button.tooth'));
    expect(buttons).toHaveLength(32);
    expect(buttons.every((button) => button.type === 'button' && button.tabIndex === 0)).toBe(true);
  });
});
