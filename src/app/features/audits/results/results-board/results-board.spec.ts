import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, TestRequest, provideHttpClientTesting } from '@angular/common/http/testing';
import { Component } from '@angular/core';
import { DeferBlockBehavior, TestBed } from '@angular/core/testing';
import { MatChipOptionHarness } from '@angular/material/chips/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import { Router, provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { CycleView, OperatorView, Role } from '@tidemark/shared';
import { personWithRole, provideStubAuthSession } from '../../../../core/auth/testing/stub-auth-session';
import { auditResults, calibrationResult, funnelResult, groupedResults, survivalResult, trendResult } from '../testing/results-fixtures';
import { ResultsBoard } from './results-board';

const CYCLES: CycleView[] = [
  {
    id: 4,
    auditId: 1,
    number: 1,
    periodStart: '2029-01-01',
    periodEnd: '2029-12-31',
    state: 'reported',
    frozenAt: '2030-01-02T09:00:00.000Z',
    presentedDate: null,
    notes: '',
    version: 3,
    actions: [],
  },
];

/** Invented operators; the signed-in spec person (personWithRole) has id 41. */
const OPERATORS: OperatorView[] = [
  { id: 7, displayName: 'Dr Ida Quill' },
  { id: 41, displayName: 'Dr Sam Spec' },
];

/** Stands in for the audit page, which embeds the board exactly like this. */
@Component({
  imports: [ResultsBoard],
  template: `<tm-results-board [auditId]="1" [cycles]="cycles" [operators]="operators" />`,
})
class AuditPageStandIn {
  readonly cycles = CYCLES;
  readonly operators = OPERATORS;
}

describe('ResultsBoard', () => {
  let harness: RouterTestingHarness;
  let loader: HarnessLoader;
  let http: HttpTestingController;
  let router: Router;

  async function open(url: string, role: Role = 'audit_lead'): Promise<TestRequest[]> {
    TestBed.configureTestingModule({
      // The charts live in a deferred block with their own specs; here the filters and requests matter.
      deferBlockBehavior: DeferBlockBehavior.Manual,
      providers: [
        provideRouter([{ path: 'audits/:id', component: AuditPageStandIn }]),
        provideHttpClient(),
        provideHttpClientTesting(),
        provideStubAuthSession(personWithRole(role)),
      ],
    });
    http = TestBed.inject(HttpTestingController);
    router = TestBed.inject(Router);
    harness = await RouterTestingHarness.create();
    await harness.navigateByUrl(url);
    loader = TestbedHarnessEnvironment.loader(harness.fixture);
    return answerAll();
  }

  /** Answers every open request the way the server would for its parameters, until none is left. */
  async function answerAll(): Promise<TestRequest[]> {
    const answered: TestRequest[] = [];
    for (let round = 0; round < 5; round++) {
      await settle();
      const open = http.match(() => true);
      if (open.length === 0) break;
      for (const request of open) {
        answer(request);
        answered.push(request);
      }
    }
    await settle();
    return answered;
  }

  function answer(request: TestRequest): void {
    const params = request.request.params;
    const cycleId = params.has('cycleId') ? Number(params.get('cycleId')) : null;
    const view = request.request.url.split('/').at(-1);
    if (view === 'results') {
      const frozenAt = cycleId === 4 ? CYCLES[0].frozenAt : null;
      const grouping = params.get('groupBy') === 'phenotype' ? groupedResults() : auditResults();
      request.flush({ ...grouping, cycleId, frozenAt });
    } else if (view === 'funnel') request.flush(funnelResult());
    else if (view === 'trend') request.flush(trendResult());
    else if (view === 'survival') request.flush(survivalResult());
    else request.flush(calibrationResult());
  }

  async function settle(): Promise<void> {
    await harness.fixture.whenStable();
    await harness.fixture.whenStable();
  }

  function paramsOf(requests: TestRequest[], view: string): Record<string, string | null> | undefined {
    const request = requests.filter((candidate) => candidate.request.url === `/api/audits/1/${view}`).at(-1);
    if (!request) return undefined;
    const params = request.request.params;
    return Object.fromEntries(params.keys().map((key) => [key, params.get(key)]));
  }

  async function selectedChips(): Promise<string[]> {
    const chips = await loader.getAllHarnesses(MatChipOptionHarness.with({ selected: true }));
    return Promise.all(chips.map((chip) => chip.getText()));
  }

  async function pickChip(text: string): Promise<TestRequest[]> {
    const chip = await loader.getHarness(MatChipOptionHarness.with({ text }));
    await chip.select();
    return answerAll();
  }

  /** The outcome summary's row names (its group column), top to bottom; empty when the column is not shown. */
  async function summaryRowNames(): Promise<string[]> {
    const table = await loader.getHarness(MatTableHarness.with({ ancestor: 'tm-results-summary-table' }));
    const rows = await table.getCellTextByColumnName();
    return rows['group']?.text ?? [];
  }

  function pageText(): string {
    return harness.routeNativeElement?.textContent?.replace(/\s+/g, ' ') ?? '';
  }

  afterEach(() => http.verify());

  it('reads group, interval, measure and cycle from the address and asks every endpoint for exactly that', async () => {
    const requests = await open('/audits/1?area=results&groupBy=operator&interval=12m&measure=relapse&cycle=4');

    expect(paramsOf(requests, 'results')).toEqual({ cycleId: '4', groupBy: 'operator' });
    expect(paramsOf(requests, 'funnel')).toEqual({ cycleId: '4', measure: 'relapse', intervalKey: '12m' });
    expect(paramsOf(requests, 'trend')).toEqual({ cycleId: '4', intervalKey: '12m' });
    expect(paramsOf(requests, 'survival')).toEqual({ cycleId: '4' });
    expect(paramsOf(requests, 'calibration')).toEqual({ cycleId: '4' });
    expect(await selectedChips()).toEqual(['Operator', '12 months', 'Relapse']);
    const scope = await loader.getHarness(MatSelectHarness);
    expect(await scope.getValueText()).toContain('Cycle 1');
    expect(pageText()).toContain('Frozen on 2 Jan 2030');
  });

  it('writes each chosen chip to the address, keeps other parameters, and reloads what depends on it', async () => {
    await open('/audits/1?area=results');
    expect(await selectedChips()).toEqual(['Whole cohort', '6 months', 'Complications']);
    expect(pageText()).toContain('Live: recomputed');

    let requests = await pickChip('Phenotype');
    expect(router.url).toBe('/audits/1?area=results&groupBy=phenotype');
    expect(paramsOf(requests, 'results')).toEqual({ groupBy: 'phenotype' });
    // Grouping changes neither the interval nor the scope: the funnel and trend are not asked again.
    expect(paramsOf(requests, 'trend')).toBeUndefined();

    requests = await pickChip('12 months');
    expect(router.url).toBe('/audits/1?area=results&groupBy=phenotype&interval=12m');
    expect(paramsOf(requests, 'trend')).toEqual({ intervalKey: '12m' });
    expect(paramsOf(requests, 'funnel')).toEqual({ measure: 'complication', intervalKey: '12m' });

    requests = await pickChip('Relapse');
    expect(router.url).toBe('/audits/1?area=results&groupBy=phenotype&interval=12m&measure=relapse');
    expect(paramsOf(requests, 'funnel')).toEqual({ measure: 'relapse', intervalKey: '12m' });

    requests = await pickChip('Whole cohort');
    expect(router.url).toBe('/audits/1?area=results&interval=12m&measure=relapse');
    expect(paramsOf(requests, 'results')).toEqual({});
    expect(await selectedChips()).toEqual(['Whole cohort', '12 months', 'Relapse']);
  });

  it('keeps a chosen chip chosen when it is clicked again', async () => {
    await open('/audits/1?area=results&groupBy=smoking');
    const chip = await loader.getHarness(MatChipOptionHarness.with({ text: 'Smoking' }));
    await chip.toggle();
    await answerAll();
    expect(await chip.isSelected()).toBe(true);
    expect(router.url).toBe('/audits/1?area=results&groupBy=smoking');
  });

  it('switches between live results and a cycle through the address', async () => {
    await open('/audits/1?area=results&interval=12m');
    const scope = await loader.getHarness(MatSelectHarness);
    await scope.open();
    await scope.clickOptions({ text: /Cycle 1/ });
    const requests = await answerAll();
    expect(router.url).toBe('/audits/1?area=results&interval=12m&cycle=4');
    expect(paramsOf(requests, 'results')).toEqual({ cycleId: '4' });
    expect(paramsOf(requests, 'survival')).toEqual({ cycleId: '4' });
    expect(pageText()).toContain('Frozen on 2 Jan 2030');

    await scope.open();
    await scope.clickOptions({ text: /Live/ });
    await answerAll();
    expect(router.url).toBe('/audits/1?area=results&interval=12m');
    expect(pageText()).not.toContain('Frozen on');
  });

  it('narrows every view to the phenotype and operator in the address, the funnel to the phenotype only', async () => {
    const requests = await open('/audits/1?area=results&phenotype=thin&operator=7', 'partner');
    expect(paramsOf(requests, 'results')).toEqual({ phenotype: 'thin', operatorId: '7' });
    expect(paramsOf(requests, 'trend')).toEqual({ phenotype: 'thin', operatorId: '7', intervalKey: '6m' });
    expect(paramsOf(requests, 'survival')).toEqual({ phenotype: 'thin', operatorId: '7' });
    expect(paramsOf(requests, 'calibration')).toEqual({ phenotype: 'thin', operatorId: '7' });
    expect(paramsOf(requests, 'funnel')).toEqual({ phenotype: 'thin', measure: 'complication', intervalKey: '6m' });
    const operator = await loader.getHarness(MatSelectHarness.with({ selector: '.narrow-field:last-of-type mat-select' }));
    expect(await operator.getValueText()).toBe('Dr Ida Quill');
    expect(pageText()).toContain('The operator funnel still compares every operator');
  });

  it('names the summary table’s cohort row after the narrowing, as the drift legend does', async () => {
    // Words are the filters' own: PHENOTYPE_LABELS (shared/types/clinical-terms.ts) and the operator's display name.
    await open('/audits/1?area=results&phenotype=thin&operator=7', 'partner');
    expect(await summaryRowNames()).toEqual(['Thin (≤ 1 mm) · Dr Ida Quill']);
    expect(pageText()).not.toContain('All cases');
  });

  it('calls the summary table’s cohort row “All cases” when nothing narrows it', async () => {
    await open('/audits/1?area=results&groupBy=phenotype', 'partner');
    // Group rows carry the fixture's group labels (groupedResults in testing/results-fixtures.ts).
    expect(await summaryRowNames()).toEqual(['All cases', 'Thin', 'Thick']);
    // Neither grouped nor narrowed: one row, which needs no name.
    await router.navigateByUrl('/audits/1?area=results');
    await answerAll();
    expect(await summaryRowNames()).toEqual([]);
  });

  it('writes a chosen phenotype and operator to the address and asks again', async () => {
    await open('/audits/1?area=results&groupBy=operator', 'partner');
    const [, phenotype, operator] = await loader.getAllHarnesses(MatSelectHarness);
    await phenotype.open();
    await phenotype.clickOptions({ text: 'Thick (> 1 mm)' });
    let requests = await answerAll();
    expect(router.url).toBe('/audits/1?area=results&groupBy=operator&phenotype=thick');
    expect(paramsOf(requests, 'results')).toEqual({ groupBy: 'operator', phenotype: 'thick' });
    expect(paramsOf(requests, 'funnel')).toEqual({ phenotype: 'thick', measure: 'complication', intervalKey: '6m' });

    await operator.open();
    await operator.clickOptions({ text: 'Dr Sam Spec (you)' });
    requests = await answerAll();
    expect(router.url).toBe('/audits/1?area=results&groupBy=operator&phenotype=thick&operator=41');
    expect(paramsOf(requests, 'results')).toEqual({ groupBy: 'operator', phenotype: 'thick', operatorId: '41' });
    // Only the operator changed, and the funnel does not take it: it is not asked again.
    expect(paramsOf(requests, 'funnel')).toBeUndefined();

    await phenotype.open();
    await phenotype.clickOptions({ text: 'Every phenotype' });
    await answerAll();
    expect(router.url).toBe('/audits/1?area=results&groupBy=operator&operator=41');
  });

  it('offers a clinician only their own cases and ignores another operator in the address; governance no operator at all', async () => {
    const requests = await open('/audits/1?area=results&operator=7', 'clinician');
    expect(paramsOf(requests, 'results')).toEqual({});
    const operator = (await loader.getAllHarnesses(MatSelectHarness))[2];
    await operator.open();
    expect(await Promise.all((await operator.getOptions()).map((option) => option.getText()))).toEqual(['Every operator', 'My cases only']);
    await operator.close();
  });

  it('shows governance the phenotype filter but no operator filter', async () => {
    await open('/audits/1?area=results&operator=7', 'governance');
    // Scope and phenotype only.
    expect((await loader.getAllHarnesses(MatSelectHarness)).length).toBe(2);
  });

  it('falls back to the default interval when the address names one the schedule lacks, and ignores a foreign cycle', async () => {
    const requests = await open('/audits/1?interval=9m&cycle=99');
    expect(paramsOf(requests, 'results')).toEqual({});
    expect(paramsOf(requests, 'trend')).toEqual({ intervalKey: '6m' });
    expect(await selectedChips()).toEqual(['Whole cohort', '6 months', 'Complications']);
  });
});
