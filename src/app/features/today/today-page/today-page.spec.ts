import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { provideRouter } from '@angular/router';
import type { RecallDueItem, RecallDueList, Role } from '@tidemark/shared';
import { personWithRole, provideStubAuthSession } from '../../../core/auth/testing/stub-auth-session';
import { TodayPage } from './today-page';

function due(overrides: Partial<RecallDueItem>): RecallDueItem {
  return {
    caseId: 7,
    patientCode: 'TST-0007',
    operator: { id: 5, displayName: 'Wren Adeyemi' },
    surgeryDate: '2026-01-26',
    intervalKey: '6w',
    intervalLabel: '6 weeks',
    targetDate: '2026-03-09',
    windowOpens: '2026-03-02',
    windowCloses: '2026-03-23',
    state: 'in-window',
    teeth: [11, 21],
    ...overrides,
  };
}

const LIST: RecallDueList = {
  asOf: '2026-03-10',
  inWindow: [due({})],
  overdue: [
    due({
      caseId: 9,
      patientCode: 'TST-0009',
      operator: { id: 6, displayName: 'Ola Brandt' },
      intervalKey: '3m',
      intervalLabel: '3 months',
      windowOpens: '2026-02-10',
      windowCloses: '2026-03-05',
      state: 'overdue',
      teeth: [13],
    }),
  ],
  upcoming: [],
};

describe('TodayPage', () => {
  let fixture: ComponentFixture<TodayPage>;
  let loader: HarnessLoader;
  let http: HttpTestingController;

  async function open(role: Role, list: RecallDueList = LIST): Promise<void> {
    TestBed.configureTestingModule({
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting(), provideStubAuthSession(personWithRole(role))],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(TodayPage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    http.expectOne('/api/recalls/due').flush(list);
    await fixture.whenStable();
  }

  afterEach(() => http.verify());

  const element = (): HTMLElement => fixture.nativeElement;
  const words = (node: Element | null | undefined) => node?.textContent?.replace(/\s+/g, ' ').trim() ?? '';
  const group = (key: string) => element().querySelector(`#group-${key}`);

  it('shows the three groups in order with their counts and a plain empty state', async () => {
    await open('audit_lead');
    const headings = [...element().querySelectorAll('h2')].map(words);
    expect(headings).toEqual([
      'event_available In window now 1',
      'event_busy Overdue 1',
      'upcoming Coming up (next 14 days) 0',
    ]);
    expect(words(group('upcoming'))).toContain('No recall window opens in the next 14 days.');
  });

  it('links each recall straight to its entry page and to its case', async () => {
    await open('audit_lead');
    const card = group('inWindow')?.querySelector('tm-recall-card');
    const enter = card?.querySelector<HTMLAnchorElement>('a.enter');
    expect(enter?.getAttribute('href')).toBe('/cases/7/recall/6w');
    expect(words(enter)).toContain('Enter recall');
    expect(card?.querySelector('a.open')?.getAttribute('href')).toBe('/cases/7');
    expect(words(card)).toContain('TST-0007');
    expect(words(card)).toContain('11, 21');
    expect(words(card)).toContain('Window closes in 13 days');
    expect(words(card)).toContain('Wren Adeyemi');
  });

  it('says overdue with an icon and a word, not colour alone', async () => {
    await open('audit_lead');
    const card = group('overdue')?.querySelector('tm-recall-card');
    expect(card?.classList).toContain('overdue');
    expect(words(card?.querySelector('.state'))).toBe('event_busy Overdue');
    expect(words(card)).toContain('Window closed 5 days ago');
    expect(card?.querySelector('a.enter')?.getAttribute('href')).toBe('/cases/9/recall/3m');
  });

  it("lets the audit lead narrow the list to one operator", async () => {
    await open('audit_lead');
    const operator = await loader.getHarness(MatSelectHarness);
    await operator.open();
    await operator.clickOptions({ text: 'Ola Brandt' });
    await fixture.whenStable();
    expect(words(group('inWindow'))).toContain('No recall window is open today.');
    expect(words(group('overdue'))).toContain('TST-0009');
  });

  it('gives a clinician no operator filter or names: the list is theirs', async () => {
    await open('clinician');
    expect(await loader.getAllHarnesses(MatSelectHarness)).toHaveLength(0);
    expect(words(element())).not.toContain('Wren Adeyemi');
    expect(words(element())).toContain('for your cases');
  });

  it('offers a retry when the list cannot be loaded', async () => {
    TestBed.configureTestingModule({
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting(), provideStubAuthSession(personWithRole('clinician'))],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(TodayPage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    http.expectOne('/api/recalls/due').flush(null, { status: 500, statusText: 'Server Error' });
    await fixture.whenStable();
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Try again' }))).click();
    http.expectOne('/api/recalls/due').flush({ ...LIST, inWindow: [], overdue: [] });
    await fixture.whenStable();
    expect(words(group('overdue'))).toContain('Nothing is overdue');
  });
});
