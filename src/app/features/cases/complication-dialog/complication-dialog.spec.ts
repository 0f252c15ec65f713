import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import type { ComplicationView } from '@tidemark/shared';
import { caseDetailFixture } from '../testing/case-detail-fixture';
import { ComplicationDialog, type ComplicationDialogData } from './complication-dialog';

const EXISTING: ComplicationView = {
  id: 9,
  visitId: null,
  type: 'delayed-healing',
  grade: 'I',
  onsetDate: '2026-01-10',
  resolutionDate: null,
  management: 'Chlorhexidine rinse',
  version: 2,
};

describe('ComplicationDialog', () => {
  let fixture: ComponentFixture<ComplicationDialog>;
  let loader: HarnessLoader;
  let http: HttpTestingController;
  const close = vi.fn();

  async function open(data: ComplicationDialogData): Promise<void> {
    close.mockReset();
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MatDialogRef, useValue: { close } },
        { provide: MAT_DIALOG_DATA, useValue: data },
      ],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ComplicationDialog);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  }

  afterEach(() => http.verify());

  const field = (label: string) => loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));

  async function choose(label: string, option: string | RegExp): Promise<void> {
    const select = (await (await field(label)).getControl(MatSelectHarness)) ?? null;
    if (!select) throw new Error(`No select for ${label}.`);
    await select.open();
    await select.clickOptions({ text: option });
  }

  async function dateInput(label: string): Promise<MatInputHarness> {
    const control = await (await field(label)).getControl(MatInputHarness);
    if (!control) throw new Error(`No input for ${label}.`);
    return control;
  }

  const submit = async (text: string) => (await loader.getHarness(MatButtonHarness.with({ text }))).click();

  it("checks with the shared schema, including resolution before onset, and sends nothing until it passes", async () => {
    await open({ caseId: 12, visits: caseDetailFixture().visits });
    await submit('Add complication');
    expect(await (await field('Type')).getTextErrors()).toEqual(['Choose a type.']);
    expect(await (await field('Clavien–Dindo grade')).getTextErrors()).toEqual(['Choose a Clavien–Dindo grade.']);
    expect(await (await field('Onset')).getTextErrors()).toEqual(['Enter the date it began.']);

    await choose('Type', 'Bleeding');
    await choose('Clavien–Dindo grade', /^II —/);
    await (await dateInput('Onset')).setValue('2026-01-10');
    await (await dateInput('Resolved on')).setValue('2026-01-08');
    await submit('Add complication');
    expect(await (await field('Resolved on')).getTextErrors()).toEqual(['Resolution cannot come before onset.']);
    http.expectNone('/api/cases/12/complications');
  });

  it('records a complication, linked to a recall, and closes with it', async () => {
    await open({ caseId: 12, visits: caseDetailFixture().visits });
    await choose('Type', 'Bleeding');
    await choose('Clavien–Dindo grade', /^I —/);
    await (await dateInput('Onset')).setValue('2026-01-06');
    await choose('Noted at recall', /6 weeks/);
    await (await dateInput('Management')).setValue('Pressure, haemostatic gauze');
    await submit('Add complication');

    const request = http.expectOne('/api/cases/12/complications');
    expect(request.request.body).toEqual({
      type: 'bleeding',
      grade: 'I',
      onsetDate: '2026-01-06',
      resolutionDate: null,
      visitId: 301,
      management: 'Pressure, haemostatic gauze',
    });
    const saved = { ...EXISTING, id: 10, type: 'bleeding' as const, visitId: 301 };
    request.flush(saved, { status: 201, statusText: 'Created' });
    expect(close).toHaveBeenCalledWith(saved);
  });

  it("shows the server's field errors under their fields", async () => {
    await open({ caseId: 12, visits: [] });
    await choose('Type', 'Infection');
    await choose('Clavien–Dindo grade', /^II —/);
    await (await dateInput('Onset')).setValue('2026-01-01');
    await submit('Add complication');
    http
      .expectOne('/api/cases/12/complications')
      .flush(
        { error: { code: 'validation', message: 'A complication cannot start before the surgery.', fields: { onsetDate: 'Must be on or after 2026-01-05.' } } },
        { status: 400, statusText: 'Bad Request' },
      );
    await fixture.whenStable();
    expect(await (await field('Onset')).getTextErrors()).toEqual(['Must be on or after 2026-01-05.']);
    expect(close).not.toHaveBeenCalled();
  });

  it('corrects an existing complication with its version and a reason', async () => {
    await open({ caseId: 12, visits: [], complication: EXISTING });
    await (await dateInput('Resolved on')).setValue('2026-01-24');
    await submit('Save correction');
    expect(await (await field('Reason for the correction')).getTextErrors()).toEqual([
      'Say why the value changes (at least 3 characters).',
    ]);
    http.expectNone('/api/complications/9');

    await (await dateInput('Reason for the correction')).setValue('Healed at review');
    await submit('Save correction');
    const request = http.expectOne('/api/complications/9');
    expect(request.request.method).toBe('PATCH');
    expect(request.request.body).toEqual({
      type: 'delayed-healing',
      grade: 'I',
      onsetDate: '2026-01-10',
      resolutionDate: '2026-01-24',
      management: 'Chlorhexidine rinse',
      version: 2,
      reason: 'Healed at review',
    });
    request.flush({ ...EXISTING, resolutionDate: '2026-01-24', version: 3 });
    expect(close).toHaveBeenCalled();
  });
});
