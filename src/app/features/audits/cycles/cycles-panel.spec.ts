import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { CYCLE_STATES, CYCLE_STATE_NEXT, type AuditView, type CycleState } from '@tidemark/shared';
import { textOf } from '../../cases/testing/text-of';
import { auditFixture, cycleFixture } from '../testing/audit-fixture';
import { CyclesPanel } from './cycles-panel';
import { stageMovesFrom } from './stage-moves';

describe('CyclesPanel', () => {
  let fixture: ComponentFixture<CyclesPanel>;
  let loader: HarnessLoader;
  let documentLoader: HarnessLoader;
  let http: HttpTestingController;

  async function show(audit: AuditView, canWrite: boolean): Promise<void> {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(CyclesPanel);
    fixture.componentRef.setInput('audit', audit);
    fixture.componentRef.setInput('canWrite', canWrite);
    loader = TestbedHarnessEnvironment.loader(fixture);
    documentLoader = TestbedHarnessEnvironment.documentRootLoader(fixture);
    await fixture.whenStable();
  }

  afterEach(() => http.verify());

  const element = (): HTMLElement => fixture.nativeElement;
  const moveButtons = (): string[] => [...element().querySelectorAll('button.move')].map((button) => textOf(button).replace(/^\S+ /, ''));

  it.each(CYCLE_STATES.map((state) => [state]))('offers the moves CYCLE_STATE_NEXT allows from %s, and no others', async (state: CycleState) => {
    await show(auditFixture({ cycles: [cycleFixture({ state })] }), true);
    const expected = stageMovesFrom(state).map((move) => move.label);
    expect(expected).toHaveLength(CYCLE_STATE_NEXT[state].length);
    expect(moveButtons()).toEqual(expected);
  });

  it('names each move for where it goes, including the way back from weighing', () => {
    expect(stageMovesFrom('scoping').map((move) => [move.to, move.label])).toEqual([['gathering', 'Start gathering data']]);
    expect(stageMovesFrom('weighing').map((move) => [move.to, move.label])).toEqual([
      ['gathering', 'Back to gathering data'],
      ['reported', 'Report and freeze results'],
    ]);
    expect(stageMovesFrom('closed')).toEqual([]);
  });

  it('moves a stage with the version it was read at', async () => {
    await show(auditFixture({ cycles: [cycleFixture({ state: 'scoping', version: 5 })] }), true);
    await (await loader.getHarness(MatButtonHarness.with({ text: /Start gathering data/ }))).click();
    const request = http.expectOne('/api/cycles/71');
    expect(request.request.method).toBe('PATCH');
    expect(request.request.body).toEqual({ state: 'gathering', version: 5 });
    request.flush(cycleFixture({ state: 'gathering', version: 6 }));
  });

  it('asks before reporting, saying the results will be frozen, and sends nothing if cancelled', async () => {
    await show(auditFixture({ cycles: [cycleFixture({ state: 'weighing', version: 3 })] }), true);
    await (await loader.getHarness(MatButtonHarness.with({ text: /Report and freeze results/ }))).click();
    let dialog = await documentLoader.getHarness(MatDialogHarness);
    expect(await dialog.getText()).toContain('The results will be frozen');
    http.expectNone('/api/cycles/71');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Cancel' }))).click();
    http.expectNone('/api/cycles/71');

    await (await loader.getHarness(MatButtonHarness.with({ text: /Report and freeze results/ }))).click();
    dialog = await documentLoader.getHarness(MatDialogHarness);
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Report and freeze results' }))).click();
    const request = http.expectOne('/api/cycles/71');
    expect(request.request.body).toEqual({ state: 'reported', version: 3 });
    request.flush(cycleFixture({ state: 'reported', frozenAt: '2026-03-01T10:00:00.000Z', version: 4 }));
  });

  it('lists cycles in order with period, stage, frozen and presented dates', async () => {
    const reported = cycleFixture({ id: 71, number: 1, state: 'reported', frozenAt: '2026-02-01T09:00:00.000Z', presentedDate: '2026-02-10' });
    const reaudit = cycleFixture({ id: 72, number: 2, state: 'gathering', periodStart: '2026-01-01', periodEnd: '2026-06-30' });
    await show(auditFixture({ cycles: [reaudit, reported] }), false);
    const cards = [...element().querySelectorAll('li.cycle')].map(textOf);
    expect(cards).toHaveLength(2);
    expect(cards[0]).toMatch(/^Cycle 1 lock Reported .*1 Jan 2025 – 30 Jun 2025.*Frozen 1 Feb 2026.*10 Feb 2026/);
    expect(cards[1]).toMatch(/^Cycle 2 \(re-audit\) playlist_add Gathering data .*Live, not frozen.*Not yet/);
  });

  it('marks overdue actions with an icon and a word, and only those still to do', async () => {
    const owner = { id: 5, displayName: 'Wren Adeyemi' };
    const actions = [
      { id: 1, cycleId: 71, action: 'Late and open', owner, dueDate: '2020-01-01', state: 'open' as const, version: 1 },
      { id: 2, cycleId: 71, action: 'Late but done', owner, dueDate: '2020-01-01', state: 'done' as const, version: 1 },
      { id: 3, cycleId: 71, action: 'Not yet due', owner, dueDate: '2999-01-01', state: 'under-way' as const, version: 1 },
    ];
    await show(auditFixture({ cycles: [cycleFixture({ actions })] }), false);
    const rows = [...element().querySelectorAll('tm-action-plan tr.mat-mdc-row')].map(textOf);
    expect(rows[0]).toContain('alarm Overdue');
    expect(rows[1]).not.toContain('Overdue');
    expect(rows[2]).not.toContain('Overdue');
  });

  it('shows a reader no way to open, move, edit or delete', async () => {
    await show(auditFixture({ cycles: [cycleFixture({ state: 'weighing' })] }), false);
    expect(await loader.getAllHarnesses(MatButtonHarness)).toHaveLength(0);
  });
});
