import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, DeferBlockBehavior, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatTabGroupHarness } from '@angular/material/tabs/testing';
import { Router, provideRouter } from '@angular/router';
import type { Role, SessionUser } from '@tidemark/shared';
import { personWithRole, provideStubAuthSession } from '../../../core/auth/testing/stub-auth-session';
import { CLINICAL_CAUTION } from '../../../shared/clinical-caution/clinical-caution';
import { textOf } from '../../cases/testing/text-of';
import { OPERATORS, SCHEDULE, auditFixture, resultsFixture } from '../testing/audit-fixture';
import { AuditPage } from './audit-page';

/** Buttons only a writer may see, by their words or accessible names. */
const WRITE_CONTROLS = /Save scope|Create audit|Add standard|Change standard|Remove standard|New cycle|Edit cycle|Delete cycle|Add action|Start|Report|Close the cycle|Back to/;

describe('AuditPage', () => {
  let fixture: ComponentFixture<AuditPage>;
  let loader: HarnessLoader;
  let http: HttpTestingController;

  async function open(user: SessionUser, area?: string): Promise<void> {
    TestBed.configureTestingModule({
      imports: [AuditPage],
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting(), provideStubAuthSession(user)],
      // The results board belongs to its own specs; here it stays a placeholder.
      deferBlockBehavior: DeferBlockBehavior.Manual,
    });
    // The @defer block around the results board is resolved at compile time.
    await TestBed.compileComponents();
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(AuditPage);
    fixture.componentRef.setInput('id', '12');
    if (area) fixture.componentRef.setInput('area', area);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
    if (user.role === 'audit_lead' || user.role === 'partner') http.expectOne('/api/operators').flush(OPERATORS);
    http.expectOne('/api/audits/12').flush(auditFixture());
    await fixture.whenStable();
    http.expectOne((request) => request.url === '/api/audits/12/results').flush(resultsFixture());
    await fixture.whenStable();
    if (user.role === 'audit_lead') http.expectOne('/api/schedules').flush([SCHEDULE]);
    await fixture.whenStable();
  }

  afterEach(() => {
    // The lead's scope form counts its cohort in the background; that count has its own spec (cohort-builder).
    for (const count of http.match('/api/audits/cohort-preview')) count.flush({ cases: 1, patients: 1, sites: 1 });
    http.verify();
  });

  const element = (): HTMLElement => fixture.nativeElement;

  async function selectArea(label: string): Promise<void> {
    await (await loader.getHarness(MatTabGroupHarness)).selectTab({ label });
    await fixture.whenStable();
  }

  async function writeButtons(): Promise<string[]> {
    const buttons = await loader.getAllHarnesses(MatButtonHarness);
    const words = await Promise.all(buttons.map(async (button) => `${await button.getText()} ${(await (await button.host()).getAttribute('aria-label')) ?? ''}`));
    return words.filter((text) => WRITE_CONTROLS.test(text));
  }

  it('heads the audit with its title, lead, latest cycle stage and the clinical caution', async () => {
    await open(personWithRole('partner'));
    expect(textOf(element().querySelector('h1'))).toBe('Spec audit of upper front margins');
    const facts = textOf(element().querySelector('.facts'));
    expect(facts).toContain('Led by Aiko Sato');
    expect(facts).toContain('1 standard');
    expect(facts).toContain('Cycle 1 balance Weighing results');
    expect(textOf(element())).toContain(CLINICAL_CAUTION);
  });

  it('opens the area named in the address and keeps a newly chosen one there', async () => {
    await open(personWithRole('partner'), 'criteria');
    const tabs = await loader.getHarness(MatTabGroupHarness);
    expect(await (await tabs.getSelectedTab()).getLabel()).toBe('Criteria');
    const navigate = vi.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    await tabs.selectTab({ label: 'Cycles & actions' });
    expect(navigate).toHaveBeenCalledWith([], expect.objectContaining({ queryParams: { area: 'cycles' }, queryParamsHandling: 'merge' }));
    http.expectOne('/api/audits/12/notes').flush([]);
  });

  it('lists each standard with its latest result as a verdict in words', async () => {
    await open(personWithRole('partner'), 'criteria');
    const row = textOf(element().querySelector('tm-criteria-table tr.mat-mdc-row'));
    expect(row).toContain('Mean rebound at an interval At 3 months');
    expect(row).toContain('≤ 0.9 mm');
    expect(row).toContain('check_circle Met 0.6 mm (95% CI 0.4 to 0.8 mm; n = 11)');
  });

  it.each<[string, Role]>([
    ['a partner', 'partner'],
    ['a governance member', 'governance'],
    ['a clinician', 'clinician'],
  ])('shows %s the audit without any way to change it', async (_who, role) => {
    await open(personWithRole(role));
    expect(element().querySelector('tm-scope-editor')).toBeNull();
    expect(textOf(element().querySelector('tm-scope-summary'))).toContain('Region Upper front (canine to canine)');
    expect(await writeButtons()).toEqual([]);
    await selectArea('Criteria');
    expect(await writeButtons()).toEqual([]);
    await selectArea('Cycles & actions');
    if (role === 'partner') http.expectOne('/api/audits/12/notes').flush([]);
    expect(await writeButtons()).toEqual([]);
    // Review notes are for partners (and the lead) only.
    expect(element().querySelector('tm-review-notes') !== null).toBe(role === 'partner');
  });

  it('names operators in the cohort only for those who may see names', async () => {
    await open(personWithRole('governance'));
    expect(textOf(element().querySelector('tm-scope-summary'))).toContain('Operators 1 operator');
  });

  it('gives the audit lead the scope form, standard controls and cycle moves', async () => {
    await open({ ...personWithRole('audit_lead'), id: 2 });
    expect(element().querySelector('tm-scope-editor')).not.toBeNull();
    expect(await writeButtons()).toEqual(['save Save scope ']);
    await selectArea('Criteria');
    expect(await writeButtons()).toContain('add Add standard ');
    await selectArea('Cycles & actions');
    http.expectOne('/api/audits/12/notes').flush([]);
    const words = await writeButtons();
    expect(words).toContain('add New cycle ');
    expect(words).toContain('lock Report and freeze results ');
  });

  it('saves the scope with its version and offers a reload when someone else changed it first', async () => {
    await open({ ...personWithRole('audit_lead'), id: 2 });
    const title = await loader.getHarness(MatInputHarness.with({ value: 'Spec audit of upper front margins' }));
    await title.setValue('Upper front margins, second look');
    await (await loader.getHarness(MatButtonHarness.with({ text: /Save scope/ }))).click();
    const save = http.expectOne('/api/audits/12');
    expect(save.request.method).toBe('PATCH');
    expect(save.request.body).toEqual(expect.objectContaining({ title: 'Upper front margins, second look', version: 4, scheduleId: 3 }));
    expect(save.request.body.cohort).toEqual(expect.objectContaining({ regions: ['maxillary-anterior'], indications: ['aesthetic'], operatorIds: [5] }));
    save.flush({ error: { code: 'conflict', message: 'Someone else changed this record since you opened it.' } }, { status: 409, statusText: 'Conflict' });
    await fixture.whenStable();
    expect(textOf(element().querySelector('tm-scope-editor [role="alert"]'))).toContain('Someone else changed this audit');

    await (await loader.getHarness(MatButtonHarness.with({ text: /Reload the audit/ }))).click();
    const reload = http.expectOne('/api/audits/12');
    expect(reload.request.method).toBe('GET');
    reload.flush(auditFixture({ title: 'Renamed by a colleague', version: 5 }));
    await fixture.whenStable();
    http.expectOne((request) => request.url === '/api/audits/12/results').flush(resultsFixture());
    await fixture.whenStable();
    expect(textOf(element().querySelector('h1'))).toBe('Renamed by a colleague');
    expect(await loader.getHarness(MatInputHarness.with({ value: 'Renamed by a colleague' }))).toBeTruthy();
  });
});
