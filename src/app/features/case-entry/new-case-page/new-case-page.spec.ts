import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatRadioButtonHarness } from '@angular/material/radio/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { MatStepperHarness } from '@angular/material/stepper/testing';
import { By } from '@angular/platform-browser';
import { Router, provideRouter } from '@angular/router';
import { personWithRole, provideStubAuthSession } from '../../../core/auth/testing/stub-auth-session';
import { ToothPickerHarness } from '../../../shared/tooth-picker/testing/tooth-picker-harness';
import { SitesStep } from '../sites-step/sites-step';
import { NewCasePage } from './new-case-page';

describe('NewCasePage', () => {
  let fixture: ComponentFixture<NewCasePage>;
  let loader: HarnessLoader;
  let http: HttpTestingController;
  let navigate: ReturnType<typeof vi.fn>;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([]), provideStubAuthSession(personWithRole('clinician'))],
    });
    http = TestBed.inject(HttpTestingController);
    navigate = vi.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    fixture = TestBed.createComponent(NewCasePage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
    http.expectOne('/api/operators').flush([
      { id: 41, displayName: 'Sam clinician' },
      { id: 7, displayName: 'Dr Other Operator' },
    ]);
    await fixture.whenStable();
  });

  afterEach(() => {
    // Reset first, so a request left open by one failing test cannot break the next one's set-up.
    TestBed.resetTestingModule();
    http.verify();
  });

  const field = (label: string) => loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));
  const press = async (text: string | RegExp) => (await loader.getHarness(MatButtonHarness.with({ text }))).click();
  const selectedStep = async () => (await (await loader.getHarness(MatStepperHarness)).getSteps({ selected: true }))[0]?.getLabel();

  async function type(label: string, value: string): Promise<void> {
    const control = await (await field(label)).getControl(MatInputHarness);
    await control?.setValue(value);
  }

  async function choose(label: string, option: string | RegExp): Promise<void> {
    const select = await (await field(label)).getControl(MatSelectHarness);
    await select?.open();
    await select?.clickOptions({ text: option });
  }

  /** A valid new patient and case, up to the baseline step with tooth 11 chosen. */
  async function reachBaseline(): Promise<void> {
    await type('Patient code', 'tm-0100');
    await type('Birth year', '1979');
    await choose('Sex', 'Female');
    await choose('Smoking', 'Never smoked');
    await choose('Diabetes', 'No diabetes');
    await choose('Gingival phenotype', /Thick/);
    await choose('Phenotype assessed by', 'Transgingival probing');
    await press(/Next: surgery plan/);
    await fillSurgeryAndTooth();
  }

  async function fillSurgeryAndTooth(): Promise<void> {
    await choose('Procedure', /^Gingivectomy/);
    await choose('Indication', /ferrule/);
    await choose('Instrument', 'Scalpel');
    await press(/Next: teeth/);
    await (await loader.getHarness(ToothPickerHarness)).toggle(11);
    await press(/Next: baseline/);
  }

  it('walks through the four steps and registers the case for the signed-in clinician', async () => {
    expect(await selectedStep()).toBe('Patient');
    await press(/Next: surgery plan/);
    expect(await selectedStep()).toBe('Patient');
    expect(await (await field('Patient code')).getTextErrors()).toEqual(['Enter the patient code.']);

    await reachBaseline();
    expect(await selectedStep()).toBe('Baseline readings');
    await type('Baseline REF→GM', '8');
    await press(/Save case/);

    const request = http.expectOne('/api/cases');
    expect(request.request.body).toMatchObject({
      patient: { code: 'TM-0100', birthYear: 1979, sex: 'female', smoking: 'never', cigarettesPerDay: null, phenotype: 'thick' },
      operatorId: 41,
      procedure: 'gingivectomy',
      indication: 'restorative-ferrule',
      status: 'planned',
      sites: [{ tooth: 11, location: 'mid-facial', referencePoint: 'incisal-edge', baselineRefGm: 8, papillaScore: null, postOpRefGm: null }],
    });
    expect(request.request.body.patientId).toBeUndefined();
    request.flush({ id: 91, patient: { code: 'TM-0100' } }, { status: 201, statusText: 'Created' });
    expect(navigate).toHaveBeenCalledWith(['/cases', 91]);
  });

  it('finds an existing patient by code and sends only its id', async () => {
    await (await loader.getHarness(MatButtonToggleHarness.with({ text: /Find an existing code/ }))).check();
    await press(/Next: surgery plan/);
    expect(await selectedStep()).toBe('Patient');
    expect(fixture.nativeElement.textContent).toContain('Choose a patient from the results.');

    await type('Patient code', 'tm-00');
    await new Promise((resolve) => setTimeout(resolve, 300));
    const search = http.expectOne((request) => request.url === '/api/patients');
    expect(search.request.params.get('code')).toBe('tm-00');
    search.flush([
      { id: 3, code: 'TM-0007', birthYear: 1984, sex: 'male', smoking: 'never', cigarettesPerDay: null, diabetes: 'none', phenotype: 'thin', phenotypeMethod: 'visual', version: 1 },
    ]);
    await fixture.whenStable();
    await (await loader.getHarness(MatRadioButtonHarness.with({ label: /TM-0007/ }))).check();
    await press(/Next: surgery plan/);
    await fillSurgeryAndTooth();
    await type('Baseline REF→GM', '7.5');
    await press(/Save case/);

    const request = http.expectOne('/api/cases');
    expect(request.request.body.patientId).toBe(3);
    expect(request.request.body.patient).toBeUndefined();
    request.flush({ id: 92, patient: { code: 'TM-0007' } }, { status: 201, statusText: 'Created' });
    expect(navigate).toHaveBeenCalledWith(['/cases', 92]);
  });

  it('keeps the operator fixed to the signed-in clinician', async () => {
    await reachBaseline();
    const operator = await (await field('Operator')).getControl(MatSelectHarness);
    expect(await operator?.isDisabled()).toBe(true);
    expect(await operator?.getValueText()).toBe('Sam clinician');
  });

  it('asks for cigarettes a day only from a current smoker', async () => {
    expect(await loader.getHarnessOrNull(MatFormFieldHarness.with({ floatingLabelText: 'Cigarettes a day' }))).toBeNull();
    await choose('Smoking', 'Current smoker');
    expect(await loader.getHarnessOrNull(MatFormFieldHarness.with({ floatingLabelText: 'Cigarettes a day' }))).not.toBeNull();
  });

  it('adds papilla sites per tooth from the sites step', async () => {
    await reachBaseline();
    await (await loader.getHarness(MatStepperHarness)).selectStep({ label: 'Teeth & sites' });
    const picker = await loader.getHarness(ToothPickerHarness);
    expect(await picker.getSelectedTeeth()).toEqual([11]);
    await picker.toggle(21);
    expect(await picker.getPressed(21)).toBe('true');
    const checkbox: HTMLInputElement | null = fixture.nativeElement.querySelector('[aria-label="Sites on tooth 21"] mat-checkbox:nth-child(2) input');
    checkbox?.click();
    await fixture.whenStable();
    const sites = fixture.debugElement.query(By.directive(SitesStep)).componentInstance.form().controls.sites;
    expect(sites.getRawValue().map((site: { tooth: number; location: string }) => `${site.tooth} ${site.location}`)).toEqual([
      '11 mid-facial',
      '21 mid-facial',
      '21 mesial-papilla',
    ]);
  });

  it('shows the planning check live when excision would leave under 2 mm of keratinized tissue', async () => {
    await reachBaseline();
    const panel = (): string => fixture.nativeElement.querySelector('tm-planning-check-panel')?.textContent ?? '';
    await type('KT width', '3');
    expect(panel()).toBe('');
    // 3 mm KT − 1.5 mm excision leaves 1.5 mm, under the 2 mm guidance (Lang & Löe 1972).
    await type('Planned excision', '1.5');
    expect(panel()).toContain('About 1.5 mm of keratinized tissue would remain');
    expect(panel()).toContain('Consider osseous recontouring / an apically positioned flap');
    expect(panel()).toContain('Guidance thresholds, not a decision');
    await type('Planned excision', '1');
    expect(panel()).toBe('');
  });

  it("puts the server's field errors on their controls and opens that step", async () => {
    await reachBaseline();
    await type('Baseline REF→GM', '8');
    await press(/Save case/);
    http.expectOne('/api/cases').flush(
      { error: { code: 'validation', message: 'Some fields need attention.', fields: { 'sites.0.tooth': 'Not an FDI tooth number (ISO 3950).' } } },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();
    expect(await selectedStep()).toBe('Teeth & sites');
    const sites = fixture.debugElement.query(By.directive(SitesStep)).componentInstance.form().controls.sites;
    expect(sites.at(0).controls.tooth.errors).toEqual({ server: 'Not an FDI tooth number (ISO 3950).' });
    expect(fixture.nativeElement.querySelector('tm-sites-step').textContent).toContain('Not an FDI tooth number (ISO 3950).');
    expect(navigate).not.toHaveBeenCalled();
  });

  it('shows a taken patient code on the code field', async () => {
    await reachBaseline();
    await type('Baseline REF→GM', '8');
    await press(/Save case/);
    http.expectOne('/api/cases').flush(
      {
        error: {
          code: 'conflict',
          message: 'A patient with this code is already registered.',
          fields: { code: 'This code is taken. Pick the existing patient or use another code.' },
        },
      },
      { status: 409, statusText: 'Conflict' },
    );
    await fixture.whenStable();
    expect(await selectedStep()).toBe('Patient');
    expect(await (await field('Patient code')).getTextErrors()).toEqual(['This code is taken. Pick the existing patient or use another code.']);
  });
});
