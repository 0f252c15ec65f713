import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, TestRequest, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatPaginatorHarness } from '@angular/material/paginator/testing';
import { Router, convertToParamMap, provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { ChangeRecordView } from '@tidemark/shared';
import { HistoryPage, historyQueryParams, readHistoryQuery } from './history-page';

const RECORDS: ChangeRecordView[] = [
  {
    id: 40,
    entity: 'case',
    entityId: 12,
    caseId: 12,
    field: 'status',
    oldValue: 'in-recall',
    newValue: 'concluded',
    changedBy: { id: 2, displayName: 'Kit Marlow' },
    changedAt: '2026-03-01T10:00:00.000Z',
    reason: '12-month recall done',
  },
  {
    id: 39,
    entity: 'patient',
    entityId: 3,
    caseId: null,
    field: 'smoking',
    oldValue: 'current',
    newValue: 'former',
    changedBy: { id: 2, displayName: 'Kit Marlow' },
    changedAt: '2026-02-27T10:00:00.000Z',
    reason: 'Stopped in January',
  },
];

describe('HistoryPage', () => {
  let harness: RouterTestingHarness;
  let loader: HarnessLoader;
  let http: HttpTestingController;
  let router: Router;

  async function open(url: string, total = 2): Promise<TestRequest> {
    TestBed.configureTestingModule({
      providers: [provideRouter([{ path: 'history', component: HistoryPage }]), provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
    router = TestBed.inject(Router);
    harness = await RouterTestingHarness.create();
    await harness.navigateByUrl(url, HistoryPage);
    loader = TestbedHarnessEnvironment.loader(harness.fixture);
    const request = http.expectOne((candidate) => candidate.url === '/api/history');
    request.flush({ items: RECORDS, total });
    await harness.fixture.whenStable();
    return request;
  }

  afterEach(() => http.verify());

  const element = (): HTMLElement => harness.fixture.nativeElement;

  it('asks for the page in the address and links each record to its case', async () => {
    const request = await open('/history?caseId=12&page=1&pageSize=50', 60);
    expect(request.request.params.get('caseId')).toBe('12');
    expect(request.request.params.get('page')).toBe('1');
    expect(request.request.params.get('pageSize')).toBe('50');

    const links = [...element().querySelectorAll<HTMLAnchorElement>('tbody a')].map((link) => link.getAttribute('href'));
    expect(links).toEqual(['/cases/12']);
    expect(element().textContent).toContain('Patient record');
    expect(element().textContent).toContain('Concluded');
    expect(await (await loader.getHarness(MatPaginatorHarness)).getRangeLabel()).toBe('51 – 60 of 60');
  });

  it('pages on the server through the address', async () => {
    await open('/history', 60);
    await (await loader.getHarness(MatPaginatorHarness)).goToNextPage();
    await harness.fixture.whenStable();
    expect(router.url).toBe('/history?page=1');
    const request = http.expectOne((candidate) => candidate.url === '/api/history');
    expect(request.request.params.get('page')).toBe('1');
    request.flush({ items: RECORDS, total: 60 });
  });

  it('filters to one case from the case-number field', async () => {
    await open('/history?page=2');
    const caseField = await loader.getHarness(MatInputHarness);
    await caseField.setValue('42');
    await new Promise((resolve) => setTimeout(resolve, 450));
    await harness.fixture.whenStable();
    expect(router.url).toBe('/history?caseId=42');
    const request = http.expectOne((candidate) => candidate.url === '/api/history');
    expect(request.request.params.get('caseId')).toBe('42');
    request.flush({ items: [], total: 0 });
    await harness.fixture.whenStable();
    expect(element().textContent).toContain('No changes are recorded for case 42.');
  });

  it('reads and writes the address without noise', () => {
    expect(readHistoryQuery(convertToParamMap({ caseId: 'x', page: '-1', pageSize: '9999' }))).toEqual({ page: 0, pageSize: 25 });
    expect(historyQueryParams({ page: 0, pageSize: 25 })).toEqual({});
    expect(historyQueryParams({ page: 3, pageSize: 50, caseId: 7 })).toEqual({ caseId: 7, page: 3, pageSize: 50 });
  });
});
