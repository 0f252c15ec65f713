import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { provideRouter } from '@angular/router';
import type { Role } from '@tidemark/shared';
import { personWithRole, provideStubAuthSession } from '../../../core/auth/testing/stub-auth-session';
import { auditFixture, cycleFixture } from '../testing/report-fixtures';
import { ReportsPage, defaultScope } from './reports-page';

const AUDITS = [auditFixture(), auditFixture({ id: 13, title: 'Spec audit without cycles', cycles: [] })];

describe('ReportsPage', () => {
  let fixture: ComponentFixture<ReportsPage>;
  let loader: HarnessLoader;
  let http: HttpTestingController;

  async function openAs(role: Role, link: { audit?: string; cycle?: string } = {}): Promise<void> {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([]), provideStubAuthSession(personWithRole(role))],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ReportsPage);
    // As the router binds `?audit=&cycle=` (withComponentInputBinding).
    if (link.audit !== undefined) fixture.componentRef.setInput('audit', link.audit);
    if (link.cycle !== undefined) fixture.componentRef.setInput('cycle', link.cycle);
    loader = TestbedHarnessEnvironment.loader(fixture);
    http.expectOne('/api/audits').flush(AUDITS);
    await fixture.whenStable();
  }

  afterEach(() => http.verify());

  const element = (): HTMLElement => fixture.nativeElement;
  const scopeSelect = () => loader.getHarness(MatSelectHarness.with({ selector: '[formControlName="scope"]' }));

  it('starts on the latest frozen cycle and marks reported cycles as frozen', async () => {
    await openAs('governance');
    const scope = await scopeSelect();
    expect(await scope.getValueText()).toBe('Cycle 1 · Jan 2025 – Jun 2025 · frozen');
    await scope.open();
    const options = await scope.getOptions();
    const texts = await Promise.all(options.map((option) => option.getText()));
    expect(texts[0]).toContain('Live results');
    expect(texts[1]).toMatch(/Cycle 1 .* Reported, frozen$/);
    expect(texts[2]).toMatch(/Cycle 2 .* Gathering data$/);
    expect(texts[2]).not.toContain('frozen');
    expect(element().textContent).toContain('Frozen when the cycle was reported');
  });

  it('switches to live results and explains that figures can change', async () => {
    await openAs('partner');
    const scope = await scopeSelect();
    await scope.open();
    await scope.clickOptions({ text: /Live results/ });
    expect(await scope.getValueText()).toBe('Live results');
    expect(element().textContent).toContain('figures can change');
    expect(element().querySelector('tm-workbook-builder')?.textContent).toContain('live results');
  });

  it('offers the committee notice and the import only to the audit lead', async () => {
    await openAs('governance');
    expect(element().querySelector('tm-workbook-builder')).not.toBeNull();
    expect(element().querySelector('tm-committee-notice')).toBeNull();
    expect(element().querySelector('a[href="/cases/import"]')).toBeNull();
  });

  it('gives the audit lead "Tell the committee" and a link to import past cases', async () => {
    await openAs('audit_lead');
    expect(element().querySelector('tm-committee-notice')).not.toBeNull();
    expect(element().querySelector('a[href="/cases/import"]')?.textContent).toContain('Import past cases');
  });

  it('opens on the audit and cycle a link names, such as the committee e-mail’s', async () => {
    await openAs('governance', { audit: '12', cycle: '72' });
    const audit = await loader.getHarness(MatSelectHarness.with({ selector: '[formControlName="auditId"]' }));
    expect(await audit.getValueText()).toBe('Spec audit of upper front margins');
    expect(await (await scopeSelect()).getValueText()).toBe('Cycle 2 · Jul 2025 – Dec 2025 · Gathering data');
    expect(element().textContent).not.toContain('not available to you');
  });

  it('opens a "live" link on live results of the linked audit', async () => {
    await openAs('governance', { audit: '13', cycle: 'live' });
    const audit = await loader.getHarness(MatSelectHarness.with({ selector: '[formControlName="auditId"]' }));
    expect(await audit.getValueText()).toBe('Spec audit without cycles');
    expect(await (await scopeSelect()).getValueText()).toBe('Live results');
  });

  it('says so when a link’s audit is not there, and opens as usual', async () => {
    await openAs('governance', { audit: '404', cycle: '72' });
    expect(element().querySelector('[role="status"]')?.textContent).toContain('not available to you any more');
    expect(await (await scopeSelect()).getValueText()).toBe('Cycle 1 · Jan 2025 – Jun 2025 · frozen');
  });

  it('chooses live results for an audit with no frozen cycle', () => {
    expect(defaultScope(auditFixture({ cycles: [cycleFixture({ id: 5 })] }))).toBe('live');
    expect(defaultScope(undefined)).toBe('live');
  });
});
