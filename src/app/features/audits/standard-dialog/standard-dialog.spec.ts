import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { STANDARD_METRICS, STANDARD_METRIC_INFO } from '@tidemark/shared';
import { SCHEDULE, standardFixture } from '../testing/audit-fixture';
import { StandardDialog, type StandardDialogData } from './standard-dialog';

/** The labels of the parameter fields, by what a metric may need. */
const PARAMETER_LABELS = {
  needsInterval: 'Recall interval',
  needsThresholdMm: 'Rebound limit',
  needsThresholdPct: 'Bleeding-score limit',
  needsGrade: 'Lowest Clavien–Dindo grade counted',
} as const;
const NEEDS = ['needsInterval', 'needsThresholdMm', 'needsThresholdPct', 'needsGrade'] as const;

describe('StandardDialog', () => {
  let loader: HarnessLoader;
  let http: HttpTestingController;
  const close = vi.fn();

  async function open(data: StandardDialogData): Promise<void> {
    close.mockReset();
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), { provide: MatDialogRef, useValue: { close } }, { provide: MAT_DIALOG_DATA, useValue: data }],
    });
    http = TestBed.inject(HttpTestingController);
    const fixture = TestBed.createComponent(StandardDialog);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  }

  afterEach(() => http.verify());

  const field = (label: string) => loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));
  const labels = async (): Promise<string[]> => {
    const fields = await loader.getAllHarnesses(MatFormFieldHarness);
    return Promise.all(fields.map((candidate) => candidate.getLabel().then((label) => label ?? '')));
  };

  async function select(label: string): Promise<MatSelectHarness> {
    const control = await (await field(label)).getControl(MatSelectHarness);
    if (!control) throw new Error(`No select for ${label}.`);
    return control;
  }

  async function type(label: string, value: string): Promise<void> {
    const control = await (await field(label)).getControl(MatInputHarness);
    if (!control) throw new Error(`No input for ${label}.`);
    await control.setValue(value);
  }

  async function chooseMeasure(metric: (typeof STANDARD_METRICS)[number]): Promise<void> {
    const measure = await select('Measure');
    await measure.open();
    await measure.clickOptions({ text: STANDARD_METRIC_INFO[metric].label });
  }

  it('asks for no parameter, comparator or target until a measure is chosen', async () => {
    await open({ auditId: 12, intervals: SCHEDULE.intervals });
    expect(await labels()).toEqual(['Criterion', 'Measure', 'Evidence source', 'Exceptions']);
  });

  it.each(STANDARD_METRICS.map((metric) => [metric]))('shows only the parameters %s needs, with its usual comparator', async (metric) => {
    await open({ auditId: 12, intervals: SCHEDULE.intervals });
    await chooseMeasure(metric);
    const info = STANDARD_METRIC_INFO[metric];
    const shown = await labels();
    for (const need of NEEDS) {
      expect(shown.includes(PARAMETER_LABELS[need]), `${PARAMETER_LABELS[need]} for ${metric}`).toBe(info[need]);
    }
    const comparator = await (await select('Met when the result is')).getValueText();
    expect(comparator).toBe(info.usualComparator === '>=' ? 'at least (≥)' : 'at most (≤)');
  });

  it('sends the parameters the measure needs and nulls for the rest', async () => {
    await open({ auditId: 12, intervals: SCHEDULE.intervals });
    await type('Criterion', 'At least 80% of sites rebound 1 mm or less at 6 months');
    await chooseMeasure('share-sites-rebound-within');
    const interval = await select('Recall interval');
    await interval.open();
    await interval.clickOptions({ text: '6 months' });
    await type('Rebound limit', '1');
    await type('Target', '80');
    await type('Evidence source', 'Practice standard');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Add standard' }))).click();

    const request = http.expectOne('/api/audits/12/standards');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({
      criterion: 'At least 80% of sites rebound 1 mm or less at 6 months',
      metric: 'share-sites-rebound-within',
      intervalKey: '6m',
      thresholdMm: 1,
      thresholdPct: null,
      minGrade: null,
      comparator: '>=',
      target: 80,
      evidenceSource: 'Practice standard',
      exceptions: '',
    });
    const saved = standardFixture({ id: 40, metric: 'share-sites-rebound-within' });
    request.flush(saved, { status: 201, statusText: 'Created' });
    expect(close).toHaveBeenCalledWith(saved);
  });

  it('says which parameter is missing, in the shared schema’s words, and sends nothing', async () => {
    await open({ auditId: 12, intervals: SCHEDULE.intervals });
    await type('Criterion', 'Few complications of grade II or worse');
    await chooseMeasure('share-cases-complication-grade');
    await type('Target', '5');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Add standard' }))).click();
    expect(await (await field('Lowest Clavien–Dindo grade counted')).getTextErrors()).toEqual(['Choose the lowest grade counted.']);
    http.expectNone('/api/audits/12/standards');
  });

  it('changes a standard with PATCH, keeping its comparator and sending its version', async () => {
    await open({ auditId: 12, intervals: SCHEDULE.intervals, standard: standardFixture() });
    await type('Target', '0.8');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Save standard' }))).click();
    const request = http.expectOne('/api/standards/31');
    expect(request.request.method).toBe('PATCH');
    expect(request.request.body).toEqual({
      criterion: 'Mean rebound at 3 months stays at 0.9 mm or less',
      metric: 'mean-rebound',
      intervalKey: '3m',
      thresholdMm: null,
      thresholdPct: null,
      minGrade: null,
      comparator: '<=',
      target: 0.8,
      evidenceSource: 'Spec source, 2020',
      exceptions: 'Re-treated sites',
      version: 2,
    });
    request.flush(standardFixture({ target: 0.8, version: 3 }));
  });
});
