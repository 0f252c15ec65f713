import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { Router, provideRouter } from '@angular/router';
import { todayIso, type CaseDetail, type SiteView, type VisitView } from '@tidemark/shared';
import { addDays } from '../recall-context';
import { RecallSiteRowHarness } from '../testing/recall-site-row-harness';
import { RecallEntryPage } from './recall-entry-page';

// Invented readings; expected outcomes follow DESIGN.md §3: rebound = post-op − recall,
// retained = recall − baseline, stable ≤ 0.5 mm < minor ≤ 1.0 mm < relapse.
const site = (id: number, location: SiteView['location'], baselineRefGm: number, postOpRefGm: number): SiteView => ({
  id,
  tooth: 11,
  location,
  referencePoint: 'incisal-edge',
  baselineRefGm,
  probingDepth: 2,
  ktWidth: 4,
  marginToCrest: 4,
  papillaScore: location === 'mid-facial' ? null : 3,
  plannedExcision: 2,
  postOpRefGm,
  crownGain: postOpRefGm - baselineRefGm,
  version: 1,
});

const surgeryDate = addDays(todayIso(), -40);
const recordedVisit: VisitView = {
  id: 7,
  intervalKey: '6w',
  intervalLabel: '6 weeks',
  visitDate: addDays(todayIso(), -2),
  examiner: { id: 41, displayName: 'Sam clinician' },
  pain: 2,
  satisfaction: 8,
  notes: '',
  measurements: [
    { id: 1, siteId: 201, refGm: 9.5, probingDepth: 2, bleedingOnProbing: false, ktWidth: 3, papillaScore: null, outcome: { rebound: 0.5, retainedGain: 1.5, percentRetained: 75, stability: 'stable', isFlaggedForReview: false } },
    { id: 2, siteId: 202, refGm: 8.5, probingDepth: 3, bleedingOnProbing: true, ktWidth: 3, papillaScore: 2, outcome: { rebound: 0.5, retainedGain: 1, percentRetained: 66.7, stability: 'stable', isFlaggedForReview: false } },
  ],
  version: 3,
};

function caseDetail(visits: VisitView[] = []): CaseDetail {
  return {
    id: 42,
    patient: { id: 5, code: 'TM-0042', birthYear: 1980, sex: 'female', smoking: 'never', cigarettesPerDay: null, diabetes: 'none', phenotype: 'thin', phenotypeMethod: 'visual', version: 1 },
    operator: { id: 41, displayName: 'Sam clinician' },
    surgeryDate,
    procedure: 'gingivectomy',
    indication: 'aesthetic',
    instrument: 'scalpel',
    hygienePhaseComplete: true,
    bleedingScorePct: 10,
    plaqueScorePct: 15,
    deepestProbingMm: 3,
    sutureResorbable: true,
    sutureSize: '6-0',
    provisionalRestorations: false,
    intraOperativeEvents: '',
    finalImpressionDate: null,
    finalRestorationDate: null,
    status: visits.length ? 'in-recall' : 'operated',
    withdrawnReason: null,
    notes: '',
    version: 2,
    // The server sends locations alphabetically; the grid shows mid-facial first.
    sites: [site(202, 'mesial-papilla', 7.5, 9), site(201, 'mid-facial', 8, 10)],
    visits,
    complications: [],
    photos: [],
    history: [],
    planningChecks: [],
  };
}

describe('RecallEntryPage', () => {
  let fixture: ComponentFixture<RecallEntryPage>;
  let loader: HarnessLoader;
  let documentLoader: HarnessLoader;
  let http: HttpTestingController;
  let navigate: ReturnType<typeof vi.fn>;

  async function open(detail: CaseDetail): Promise<void> {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([])] });
    http = TestBed.inject(HttpTestingController);
    navigate = vi.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    fixture = TestBed.createComponent(RecallEntryPage);
    fixture.componentRef.setInput('caseId', '42');
    fixture.componentRef.setInput('intervalKey', '6w');
    loader = TestbedHarnessEnvironment.loader(fixture);
    documentLoader = TestbedHarnessEnvironment.documentRootLoader(fixture);
    await fixture.whenStable();
    http.expectOne('/api/cases/42').flush(detail);
    await fixture.whenStable();
  }

  afterEach(() => {
    // Reset first, so a request left open by one failing test cannot break the next one's set-up.
    TestBed.resetTestingModule();
    http.verify();
  });

  const row = (name: string) => loader.getHarness(RecallSiteRowHarness.with({ site: name }));
  const save = async (text = /Save recall/) => (await loader.getHarness(MatButtonHarness.with({ text }))).click();

  async function fillRows(midFacial: string, papilla: string): Promise<void> {
    await (await row('11 · Mid-facial')).setValue('refGm', midFacial);
    await (await row('11 · Mesial papilla')).setValue('refGm', papilla);
  }

  it('heads the page with patient code, teeth, interval and its window', async () => {
    await open(caseDetail());
    const text: string = fixture.nativeElement.querySelector('tm-recall-header').textContent;
    expect(text).toContain('6 weeks recall · TM-0042');
    expect(text).toContain('Teeth11');
    // 6 weeks: target 42 days after surgery, window 7 days before to 14 after (DEFAULT_RECALL_SCHEDULE).
    expect(text).toMatch(/target/);
    expect(text).toContain('In window');
  });

  it('shows rebound, retained gain and stability live as REF→GM is typed', async () => {
    await open(caseDetail());
    const midFacial = await row('11 · Mid-facial');
    expect(await midFacial.getOutcomeText()).toBe('Outcome appears as REF→GM is entered');

    await midFacial.setValue('refGm', '9.5');
    const stable = await midFacial.getOutcomeText();
    expect(stable).toContain('Rebound +0.5 mm');
    expect(stable).toContain('Retained 1.5 mm');
    expect(stable).toContain('stable');

    await midFacial.setValue('refGm', '8.5');
    const relapse = await midFacial.getOutcomeText();
    expect(relapse).toContain('Rebound +1.5 mm');
    expect(relapse).toContain('Retained 0.5 mm');
    expect(relapse).toContain('relapse');
    expect(relapse).not.toContain('stable');
  });

  it('flags a negative rebound for review', async () => {
    await open(caseDetail());
    const midFacial = await row('11 · Mid-facial');
    await midFacial.setValue('refGm', '10.5');
    expect(await midFacial.getOutcomeText()).toMatch(/Rebound −0\.5 mm.*stable.*review/);
  });

  it('rejects 20.5 mm and 1.25 mm beside the field and does not save', async () => {
    await open(caseDetail());
    const midFacial = await row('11 · Mid-facial');
    await midFacial.setValue('refGm', '20.5');
    expect(await midFacial.getErrors('refGm')).toEqual(['Must be 20 mm or less.']);
    expect(await midFacial.getOutcomeText()).toBe('Outcome appears as REF→GM is entered');
    await midFacial.setValue('refGm', '1.25');
    expect(await midFacial.getErrors('refGm')).toEqual(['Use 0.5 mm steps.']);
    await (await row('11 · Mesial papilla')).setValue('refGm', '8.5');

    await save();
    http.expectNone('/api/cases/42/visits');
    expect(fixture.nativeElement.textContent).toContain('Some entries need correcting');
  });

  it('warns when REF→GM moves more than 3 mm and asks to check the reference point before saving', async () => {
    await open(caseDetail());
    await fillRows('14', '8.5');
    expect(await (await row('11 · Mid-facial')).getWarning()).toContain('4.0 mm from the post-op reading (10.0 mm)');
    expect(await (await row('11 · Mesial papilla')).getWarning()).toBeNull();

    await save();
    let dialog = await documentLoader.getHarness(MatDialogHarness);
    expect(await dialog.getTitleText()).toBe('Check the reference point');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Go back and check' }))).click();
    http.expectNone('/api/cases/42/visits');

    await save();
    dialog = await documentLoader.getHarness(MatDialogHarness);
    await (await dialog.getHarness(MatButtonHarness.with({ text: /Readings are right/ }))).click();
    const request = http.expectOne('/api/cases/42/visits');
    expect(request.request.body).toMatchObject({ intervalKey: '6w', visitDate: todayIso(), confirmLargeChange: true });
    expect(request.request.body.measurements).toEqual([
      { siteId: 201, refGm: 14, probingDepth: null, bleedingOnProbing: false, ktWidth: null, papillaScore: null },
      { siteId: 202, refGm: 8.5, probingDepth: null, bleedingOnProbing: false, ktWidth: null, papillaScore: null },
    ]);
    request.flush(caseDetail([recordedVisit]), { status: 201, statusText: 'Created' });
    expect(navigate).toHaveBeenCalledWith(['/cases', 42]);
  });

  it("asks for the confirmation when the server answers needsConfirmation, then resends", async () => {
    await open(caseDetail());
    await fillRows('9.5', '8.5');
    await save();
    const first = http.expectOne('/api/cases/42/visits');
    expect(first.request.body.confirmLargeChange).toBe(false);
    first.flush(
      {
        error: {
          code: 'validation',
          message: 'More than 3 mm change since the last reading. Check the reference point and confirm.',
          fields: { 'measurements.1.refGm': 'Changed 3.5 mm since 12 mm — check the reference point, then confirm.' },
          details: { needsConfirmation: true },
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();
    const dialog = await documentLoader.getHarness(MatDialogHarness);
    expect(await dialog.getText()).toContain('Changed 3.5 mm since 12 mm');
    expect(await (await row('11 · Mesial papilla')).getWarning()).toContain('Changed 3.5 mm since 12 mm');
    await (await dialog.getHarness(MatButtonHarness.with({ text: /Readings are right/ }))).click();
    const second = http.expectOne('/api/cases/42/visits');
    expect(second.request.body.confirmLargeChange).toBe(true);
    second.flush(caseDetail([recordedVisit]), { status: 201, statusText: 'Created' });
    expect(navigate).toHaveBeenCalledWith(['/cases', 42]);
  });

  it('keeps keyboard entry in reading order: Tab along a row then the next; Enter moves on and never saves', async () => {
    await open(caseDetail());
    const inputs: HTMLInputElement[] = Array.from(fixture.nativeElement.querySelectorAll('tm-recall-grid input'));
    const order = inputs.map((input) => input.closest('[data-field]')?.getAttribute('data-field') ?? input.getAttribute('data-field'));
    expect(order).toEqual(['refGm', 'probingDepth', 'bleedingOnProbing', 'ktWidth', 'refGm', 'probingDepth', 'bleedingOnProbing', 'ktWidth', 'papillaScore']);
    expect(inputs.every((input) => input.tabIndex >= 0)).toBe(true);

    const [refGm, probing] = inputs;
    refGm?.focus();
    refGm?.dispatchEvent(new KeyboardEvent('keydown', { key: 'Enter', bubbles: true, cancelable: true }));
    expect(document.activeElement).toBe(probing);
    http.expectNone('/api/cases/42/visits');
  });

  it('opens a recorded recall for correction: prefilled, a reason required, saved with its version', async () => {
    await open(caseDetail([recordedVisit]));
    expect(await (await row('11 · Mid-facial')).getValue('refGm')).toBe('9.5');
    expect(await (await row('11 · Mesial papilla')).getValue('papillaScore')).toBe('2');
    expect(fixture.nativeElement.textContent).toContain('Correcting a recorded recall');

    await save(/Save correction/);
    http.expectNone('/api/visits/7');
    const reason = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Reason for the change' }));
    expect(await reason.getTextErrors()).toEqual(['Say why the recall is corrected.']);

    await (await loader.getHarness(MatInputHarness.with({ selector: '[formControlName="reason"]' }))).setValue('Probe read from the wrong notch');
    await (await row('11 · Mid-facial')).setValue('refGm', '9');
    await save(/Save correction/);
    const request = http.expectOne('/api/visits/7');
    expect(request.request.method).toBe('PATCH');
    expect(request.request.body).toMatchObject({ version: 3, reason: 'Probe read from the wrong notch', confirmLargeChange: false });
    expect(request.request.body.measurements[0]).toMatchObject({ siteId: 201, refGm: 9 });
  });

  it('says when someone else changed the recall first and offers to reload it', async () => {
    await open(caseDetail([recordedVisit]));
    await (await loader.getHarness(MatInputHarness.with({ selector: '[formControlName="reason"]' }))).setValue('Late entry of BOP');
    await save(/Save correction/);
    http
      .expectOne('/api/visits/7')
      .flush({ error: { code: 'conflict', message: 'Changed meanwhile.', details: { currentVersion: 4 } } }, { status: 409, statusText: 'Conflict' });
    await fixture.whenStable();
    expect(fixture.nativeElement.textContent).toContain('Someone else changed this recall while you were correcting it.');

    await (await loader.getHarness(MatButtonHarness.with({ text: 'Reload the recall' }))).click();
    http.expectOne('/api/cases/42').flush(caseDetail([{ ...recordedVisit, version: 4 }]));
    await fixture.whenStable();
    expect(fixture.nativeElement.textContent).not.toContain('Someone else changed');
    expect(navigate).not.toHaveBeenCalled();
  });
});
