import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatCheckboxHarness } from '@angular/material/checkbox/testing';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { MatInputHarness } from '@angular/material/input/testing';
import type { ScheduleView } from '@tidemark/shared';
import { SCHEDULE } from '../testing/audit-fixture';
import { ScheduleDialog, type ScheduleDialogData } from './schedule-dialog';

describe('ScheduleDialog', () => {
  let fixture: ComponentFixture<ScheduleDialog>;
  let loader: HarnessLoader;
  let http: HttpTestingController;
  const close = vi.fn();

  beforeEach(async () => {
    close.mockReset();
    const data: ScheduleDialogData = { practice: SCHEDULE };
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), { provide: MatDialogRef, useValue: { close } }, { provide: MAT_DIALOG_DATA, useValue: data }],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ScheduleDialog);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  const input = (selector: string) => loader.getHarness(MatInputHarness.with({ selector }));
  const interval = (label: string) => loader.getHarness(MatCheckboxHarness.with({ label: new RegExp(`^${label}`) }));
  const save = async () => (await loader.getHarness(MatButtonHarness.with({ text: /Save schedule/ }))).click();
  const text = () => (fixture.nativeElement as HTMLElement).textContent?.replace(/\s+/g, ' ') ?? '';

  it('offers every practice interval, ticked, with its window', async () => {
    const boxes = await loader.getAllHarnesses(MatCheckboxHarness);
    expect(await Promise.all(boxes.map((box) => box.getLabelText()))).toEqual(['6 weeks · day 42', '3 months · day 91', '6 months · day 182']);
    expect(await Promise.all(boxes.map((box) => box.isChecked()))).toEqual([true, true, true]);
    expect(await (await input('[formControlName="windowAfterDays"]')).getValue()).toBe('14');
    expect(text()).toContain('Spec schedule');
  });

  it('saves the ticked intervals with the windows typed, keys and targets unchanged, and closes with the stored schedule', async () => {
    await (await input('[formControlName="name"]')).setValue('  Short recalls ');
    await (await interval('3 months')).uncheck();
    const windows = await loader.getAllHarnesses(MatInputHarness.with({ selector: '[formControlName="windowAfterDays"]' }));
    await windows[2].setValue('42');
    await save();
    const request = http.expectOne('/api/schedules');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({
      name: 'Short recalls',
      intervals: [
        { key: '6w', label: '6 weeks', targetDays: 42, windowBeforeDays: 7, windowAfterDays: 14 },
        { key: '6m', label: '6 months', targetDays: 182, windowBeforeDays: 14, windowAfterDays: 42 },
      ],
    });
    const stored: ScheduleView = { id: 9, isDefault: false, version: 1, ...request.request.body };
    request.flush(stored);
    expect(close).toHaveBeenCalledWith(stored);
  });

  it('rests the window of an interval left out, so a blank one there does not block saving', async () => {
    await (await input('[formControlName="name"]')).setValue('Six months only');
    await (await interval('6 weeks')).uncheck();
    await (await interval('3 months')).uncheck();
    const before = await loader.getAllHarnesses(MatInputHarness.with({ selector: '[formControlName="windowBeforeDays"]' }));
    expect(await before[0].isDisabled()).toBe(true);
    await save();
    const request = http.expectOne('/api/schedules');
    expect(request.request.body.intervals.map((chosen: { key: string }) => chosen.key)).toEqual(['6m']);
    request.flush({ id: 10, isDefault: false, version: 1, ...request.request.body });
  });

  it('asks for a name and at least one interval before sending anything', async () => {
    for (const label of ['6 weeks', '3 months', '6 months']) await (await interval(label)).uncheck();
    await save();
    expect(text()).toContain('Tick at least one interval to audit.');
    expect(text()).toContain('Enter a name.');
    http.expectNone('/api/schedules');
    expect(close).not.toHaveBeenCalled();
  });

  it('shows the server’s refusal in its words', async () => {
    await (await input('[formControlName="name"]')).setValue('Any');
    await save();
    http.expectOne('/api/schedules').flush({ error: { code: 'forbidden', message: 'Only the audit lead defines recall schedules.' } }, { status: 403, statusText: 'Forbidden' });
    await fixture.whenStable();
    expect(text()).toContain('Only the audit lead defines recall schedules.');
    expect(close).not.toHaveBeenCalled();
  });
});
