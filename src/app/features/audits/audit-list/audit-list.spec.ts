import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { SessionUser } from '@tidemark/shared';
import { personWithRole, provideStubAuthSession } from '../../../core/auth/testing/stub-auth-session';
import { textOf } from '../../cases/testing/text-of';
import { OPERATORS, auditFixture, cycleFixture } from '../testing/audit-fixture';
import { AuditList } from './audit-list';

describe('AuditList', () => {
  let fixture: ComponentFixture<AuditList>;
  let http: HttpTestingController;

  async function open(user: SessionUser): Promise<void> {
    TestBed.configureTestingModule({ providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting(), provideStubAuthSession(user)] });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(AuditList);
    await fixture.whenStable();
    if (user.role === 'audit_lead' || user.role === 'partner') http.expectOne('/api/operators').flush(OPERATORS);
    const reported = cycleFixture({ id: 70, number: 1, state: 'reported' });
    const reaudit = cycleFixture({ id: 71, number: 2, state: 'gathering' });
    http.expectOne('/api/audits').flush([auditFixture({ cycles: [reported, reaudit] }), auditFixture({ id: 13, title: 'No cycles yet', cycles: [], reauditDate: null })]);
    await fixture.whenStable();
  }

  afterEach(() => http.verify());

  const element = (): HTMLElement => fixture.nativeElement;
  const cards = (): string[] => [...element().querySelectorAll('li.card')].map(textOf);
  const newAuditLink = (): Element | null => element().querySelector('a[href="/audits/new"]');

  it('shows each audit with lead, cohort in words, standards, latest cycle stage and re-audit date', async () => {
    await open(personWithRole('partner'));
    expect(cards()[0]).toBe(
      'Spec audit of upper front margins Lead Aiko Sato Cohort Operators: Wren Adeyemi · Indication: Excess gingival display / altered passive eruption · Region: Upper front (canine to canine) ' +
        'Standards 1 Re-audit 1 Sept 2026 Latest cycle Cycle 2 playlist_add Gathering data',
    );
    expect(cards()[1]).toContain('Re-audit Not set Latest cycle No cycle yet');
  });

  it('offers "New audit" to the audit lead only', async () => {
    await open(personWithRole('audit_lead'));
    expect(newAuditLink()).not.toBeNull();
  });

  it.each([['governance' as const], ['partner' as const], ['clinician' as const]])('offers %s no way to start an audit', async (role) => {
    await open(personWithRole(role));
    expect(newAuditLink()).toBeNull();
  });
});
