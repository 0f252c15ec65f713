import { ComponentHarness } from '@angular/cdk/testing';

/** Test harness for `tm-tooth-picker`: presses teeth by FDI number and reads their state. */
export class ToothPickerHarness extends ComponentHarness {
  static hostSelector = 'tm-tooth-picker';

  /** FDI numbers in the order they are drawn. */
  async getTeeth(): Promise<number[]> {
    const buttons = await this.locatorForAll('button.tooth')();
    return Promise.all(buttons.map(async (button) => Number(await button.getAttribute('data-tooth'))));
  }

  /** FDI numbers whose button reports `aria-pressed="true"`. */
  async getSelectedTeeth(): Promise<number[]> {
    const buttons = await this.locatorForAll('button.tooth[aria-pressed="true"]')();
    return Promise.all(buttons.map(async (button) => Number(await button.getAttribute('data-tooth'))));
  }

  /** Presses one tooth. */
  async toggle(tooth: number): Promise<void> {
    await (await this.locatorFor(`button[data-tooth="${tooth}"]`)()).click();
  }

  /** The `aria-pressed` value of one tooth. */
  async getPressed(tooth: number): Promise<string | null> {
    return (await this.locatorFor(`button[data-tooth="${tooth}"]`)()).getAttribute('aria-pressed');
  }

  /** The accessible name of one tooth. */
  async getName(tooth: number): Promise<string | null> {
    return (await this.locatorFor(`button[data-tooth="${tooth}"]`)()).getAttribute('aria-label');
  }
}
