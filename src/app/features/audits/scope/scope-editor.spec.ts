import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatDialog } from '@angular/material/dialog';
import { MatSelectHarness } from '@angular/material/select/testing';
import type { ScheduleView } from '@tidemark/shared';
import { of } from 'rxjs';
import { ScheduleDialog } from '../schedule-dialog/schedule-dialog';
import { SCHEDULE } from '../testing/audit-fixture';
import { ScopeEditor } from './scope-editor';

/** What the schedule dialog hands back once the server stored the new schedule. */
const SHORT: ScheduleView = { id: 8, name: 'Short recalls', isDefault: false, version: 1, intervals: [SCHEDULE.intervals[0], SCHEDULE.intervals[2]] };

describe('ScopeEditor: a new recall schedule', () => {
  let fixture: ComponentFixture<ScopeEditor>;
  let loader: HarnessLoader;
  let http: HttpTestingController;
  const open = vi.fn();

  beforeEach(async () => {
    open.mockReset();
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), { provide: MatDialog, useValue: { open } }],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ScopeEditor);
    fixture.componentRef.setInput('leadName', 'Aiko Sato');
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
    http.expectOne('/api/schedules').flush([SCHEDULE]);
    await fixture.whenStable();
  });

  afterEach(() => {
    // The cohort count runs in the background; it has its own spec (cohort-builder).
    for (const count of http.match('/api/audits/cohort-preview')) count.flush({ cases: 1, patients: 1, sites: 1 });
    http.verify();
  });

  const intervalsShown = () => Array.from((fixture.nativeElement as HTMLElement).querySelectorAll('.intervals li')).map((item) => item.textContent?.trim() ?? '');

  it('starts from the practice schedule and chooses the schedule the dialog stored', async () => {
    open.mockReturnValue({ afterClosed: () => of(SHORT) });
    await (await loader.getHarness(MatButtonHarness.with({ text: /New schedule/ }))).click();
    expect(open).toHaveBeenCalledWith(ScheduleDialog, expect.objectContaining({ data: { practice: SCHEDULE } }));
    const select = await loader.getHarness(MatSelectHarness.with({ selector: '[formControlName="scheduleId"]' }));
    expect(await select.getValueText()).toBe('Short recalls');
    expect(intervalsShown()).toHaveLength(2);
    expect(intervalsShown()[1]).toContain('6 months');
  });

  it('keeps the schedule as it was when the dialog is cancelled', async () => {
    open.mockReturnValue({ afterClosed: () => of(undefined) });
    await (await loader.getHarness(MatButtonHarness.with({ text: /New schedule/ }))).click();
    const select = await loader.getHarness(MatSelectHarness.with({ selector: '[formControlName="scheduleId"]' }));
    expect(await select.getValueText()).toBe('Spec schedule (practice default)');
    expect(intervalsShown()).toHaveLength(3);
  });
});
