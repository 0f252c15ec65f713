import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatTabGroupHarness } from '@angular/material/tabs/testing';
import { provideRouter } from '@angular/router';
import type { CaseDetail, SessionUser } from '@tidemark/shared';
import { personWithRole, provideStubAuthSession } from '../../../core/auth/testing/stub-auth-session';
import { CLINICAL_CAUTION } from '../../../shared/clinical-caution/clinical-caution';
import { caseDetailFixture } from '../testing/case-detail-fixture';
import { textOf } from '../testing/text-of';
import { CasePage } from './case-page';

describe('CasePage', () => {
  let fixture: ComponentFixture<CasePage>;
  let loader: HarnessLoader;
  let documentLoader: HarnessLoader;
  let http: HttpTestingController;

  async function open(user: SessionUser, detail: CaseDetail = caseDetailFixture()): Promise<void> {
    TestBed.configureTestingModule({
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting(), provideStubAuthSession(user)],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(CasePage);
    fixture.componentRef.setInput('id', '12');
    loader = TestbedHarnessEnvironment.loader(fixture);
    documentLoader = TestbedHarnessEnvironment.documentRootLoader(fixture);
    await fixture.whenStable();
    http.expectOne('/api/cases/12').flush(detail);
    await fixture.whenStable();
  }

  afterEach(() => http.verify());

  const element = (): HTMLElement => fixture.nativeElement;
  const words = textOf;
  const lead = { ...personWithRole('audit_lead'), id: 2 };

  it('heads the page with the patient code, state, facts and the clinical caution', async () => {
    await open(lead);
    expect(words(element().querySelector('h1'))).toBe('TST-0012');
    expect(words(element().querySelector('.header tm-case-status-badge'))).toBe('event_repeat In recall');
    const facts = words(element().querySelector('tm-case-summary'));
    expect(facts).toContain('Thick (> 1 mm)');
    expect(facts).toContain('Current smoker, 8 a day');
    expect(facts).toContain('Gingivectomy / gingivoplasty');
    expect(facts).toContain('Wren Adeyemi');
    expect(words(element())).toContain(CLINICAL_CAUTION);
  });

  it('moves the status with the version it was read at and the reason given', async () => {
    await open(lead);
    await (await loader.getHarness(MatButtonHarness.with({ text: /Conclude case/ }))).click();
    const dialog = await documentLoader.getHarness(MatDialogHarness);
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Conclude case' }))).click();
    http.expectNone('/api/cases/12');
    expect(await dialog.getText()).toContain('Say why the value changes');

    await (await dialog.getHarness(MatInputHarness)).setValue('12-month recall done');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Conclude case' }))).click();
    const request = http.expectOne('/api/cases/12');
    expect(request.request.method).toBe('PATCH');
    expect(request.request.body).toEqual({ version: 4, reason: '12-month recall done', status: 'concluded' });
    request.flush(caseDetailFixture({ status: 'concluded', version: 5 }));
    await fixture.whenStable();
    expect(await documentLoader.getAllHarnesses(MatDialogHarness)).toHaveLength(0);
    await fixture.whenStable();
    expect(words(element().querySelector('.header tm-case-status-badge'))).toBe('task_alt Concluded');
  });

  it('keeps the withdrawal reason with the case, and the recorded suture size untouched', async () => {
    await open(lead, caseDetailFixture({ sutureSize: '6-0' }));
    await (await loader.getHarness(MatButtonHarness.with({ text: /Withdraw case/ }))).click();
    const dialog = await documentLoader.getHarness(MatDialogHarness);
    await (await dialog.getHarness(MatInputHarness)).setValue('Moved away; follow-up elsewhere');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Withdraw case' }))).click();
    const request = http.expectOne('/api/cases/12');
    expect(request.request.body).toEqual({
      version: 4,
      reason: 'Moved away; follow-up elsewhere',
      status: 'withdrawn',
      withdrawnReason: 'Moved away; follow-up elsewhere',
      sutureSize: '6-0',
    });
    request.flush(caseDetailFixture({ status: 'withdrawn', withdrawnReason: 'Moved away; follow-up elsewhere', version: 5 }));
  });

  it('offers a reload when someone else changed the case first', async () => {
    await open(lead);
    await (await loader.getHarness(MatButtonHarness.with({ text: /Conclude case/ }))).click();
    const dialog = await documentLoader.getHarness(MatDialogHarness);
    await (await dialog.getHarness(MatInputHarness)).setValue('Done');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Conclude case' }))).click();
    http.expectOne('/api/cases/12').flush(
      { error: { code: 'conflict', message: 'Someone else changed this record since you opened it.', details: { currentVersion: 5 } } },
      { status: 409, statusText: 'Conflict' },
    );
    await fixture.whenStable();
    expect(await dialog.getText()).toContain('Someone else changed this record since you opened it.');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Reload the case' }))).click();
    await fixture.whenStable();
    const reload = http.expectOne('/api/cases/12');
    expect(reload.request.method).toBe('GET');
    reload.flush(caseDetailFixture({ version: 5 }));
  });

  it('links each recall of the schedule to entry or correction for a writer', async () => {
    await open(lead);
    const links = [...element().querySelectorAll<HTMLAnchorElement>('tm-visit-timeline a')].map((link) => [
      words(link),
      link.getAttribute('href'),
    ]);
    expect(links).toEqual([
      ['Enter recall for 2 weeks', '/cases/12/recall/2w'],
      ['Correct the 6 weeks recall', '/cases/12/recall/6w'],
      ['Correct the 3 months recall', '/cases/12/recall/3m'],
      ['Enter recall for 6 months', '/cases/12/recall/6m'],
      ['Enter recall for 12 months', '/cases/12/recall/12m'],
    ]);
  });

  it.each([
    ['a partner', personWithRole('partner')],
    ["another operator's clinician", { ...personWithRole('clinician'), id: 99 }],
  ])('shows %s no way to change the record', async (_who, user) => {
    await open(user);
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /Conclude|Withdraw/ }))).toHaveLength(0);
    expect(element().querySelectorAll('tm-visit-timeline a')).toHaveLength(0);
    const tabs = await loader.getHarness(MatTabGroupHarness);
    await tabs.selectTab({ label: 'Complications (0)' });
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /Add complication/ }))).toHaveLength(0);
    await tabs.selectTab({ label: 'Photographs (0)' });
    expect(element().querySelector('tm-photo-upload')).toBeNull();
  });

  it('lets the case’s own clinician record', async () => {
    await open({ ...personWithRole('clinician'), id: 5 });
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /Conclude case/ }))).toHaveLength(1);
  });

  it('shows the change log with who, old → new and why', async () => {
    await open(
      lead,
      caseDetailFixture({
        history: [
          {
            id: 1,
            entity: 'site_measurement',
            entityId: 3011,
            caseId: 12,
            field: 'refGm',
            oldValue: '10',
            newValue: '10.5',
            changedBy: { id: 2, displayName: 'Kit Marlow' },
            changedAt: '2026-02-17T09:30:00.000Z',
            reason: 'Read the wrong notch',
          },
        ],
      }),
    );
    const tabs = await loader.getHarness(MatTabGroupHarness);
    await tabs.selectTab({ label: 'Change log (1)' });
    const log = words(element().querySelector('tm-change-record-table tbody'));
    expect(log).toContain('Kit Marlow');
    expect(log).toContain('REF→GM');
    // Millimetre readings carry their unit (DESIGN.md §3).
    expect(log).toContain('10 mm arrow_forward changed to 10.5 mm');
    expect(log).toContain('Read the wrong notch');
  });

  it('explains a case that is not there (or not theirs) instead of a blank page', async () => {
    TestBed.configureTestingModule({
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting(), provideStubAuthSession(lead)],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(CasePage);
    fixture.componentRef.setInput('id', '404');
    await fixture.whenStable();
    http.expectOne('/api/cases/404').flush({ error: { code: 'not_found', message: 'The case was not found.' } }, { status: 404, statusText: 'Not Found' });
    await fixture.whenStable();
    expect(words(element().querySelector('[role="alert"]'))).toContain('This case could not be found.');
  });
});
