import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, TestRequest, provideHttpClientTesting } from '@angular/common/http/testing';
import { Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatChipHarness } from '@angular/material/chips/testing';
import { MatPaginatorHarness } from '@angular/material/paginator/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { MatSortHarness } from '@angular/material/sort/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import { Router, provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { CaseListItem, Role } from '@tidemark/shared';
import { personWithRole, provideStubAuthSession } from '../../../core/auth/testing/stub-auth-session';
import { CaseList } from './case-list';

@Component({ template: 'case page' })
class CasePageStandIn {}

const ITEMS: CaseListItem[] = [
  {
    id: 12,
    patientCode: 'TST-0012',
    operator: { id: 5, displayName: 'Wren Adeyemi' },
    surgeryDate: '2026-01-05',
    procedure: 'gingivectomy',
    indication: 'aesthetic',
    status: 'in-recall',
    phenotype: 'thick',
    teeth: [21, 22],
    visitCount: 2,
  },
];

describe('CaseList', () => {
  let harness: RouterTestingHarness;
  let loader: HarnessLoader;
  let http: HttpTestingController;
  let router: Router;

  async function open(url: string, role: Role = 'audit_lead', total = 1): Promise<TestRequest> {
    TestBed.configureTestingModule({
      providers: [
        provideRouter([
          { path: 'cases', component: CaseList },
          { path: 'cases/:id', component: CasePageStandIn },
        ]),
        provideHttpClient(),
        provideHttpClientTesting(),
        provideStubAuthSession(personWithRole(role)),
      ],
    });
    http = TestBed.inject(HttpTestingController);
    router = TestBed.inject(Router);
    harness = await RouterTestingHarness.create();
    await harness.navigateByUrl(url, CaseList);
    loader = TestbedHarnessEnvironment.loader(harness.fixture);
    if (role !== 'clinician') {
      http.expectOne('/api/operators').flush([{ id: 5, displayName: 'Wren Adeyemi' }, { id: 6, displayName: 'Ola Brandt' }]);
    }
    const request = lastListRequest();
    request.flush({ items: ITEMS, total });
    await harness.fixture.whenStable();
    return request;
  }

  function lastListRequest(): TestRequest {
    const requests = http.match((candidate) => candidate.url === '/api/cases');
    const last = requests.at(-1);
    if (!last) throw new Error('No request for /api/cases.');
    return last;
  }

  function paramsOf(request: TestRequest): Record<string, string | null> {
    const params = request.request.params;
    return Object.fromEntries(params.keys().map((key) => [key, params.get(key)]));
  }

  async function settle(): Promise<void> {
    await harness.fixture.whenStable();
    await harness.fixture.whenStable();
  }

  afterEach(() => http.verify());

  it('reads filters, sort and page from the address and asks the server for exactly that', async () => {
    const request = await open('/cases?procedure=gingivectomy&tooth=21&page=1&pageSize=10&sort=patientCode&direction=asc&status=bogus');
    expect(paramsOf(request)).toEqual({
      page: '1',
      pageSize: '10',
      sort: 'patientCode',
      direction: 'asc',
      procedure: 'gingivectomy',
      tooth: '21',
    });

    const chips = await loader.getAllHarnesses(MatChipHarness);
    const chipTexts = await Promise.all(chips.map((chip) => chip.getText()));
    expect(chipTexts).toEqual(['Procedure: Gingivectomy / gingivoplasty', 'Tooth 21']);
    // The less-used filters open by themselves when one of them is in use, showing the value.
    const procedure = await loader.getHarness(MatSelectHarness.with({ selector: '[formControlName="procedure"]' }));
    expect(await procedure.getValueText()).toBe('Gingivectomy / gingivoplasty');
    const sort = await loader.getHarness(MatSortHarness);
    expect(await (await sort.getActiveHeader())?.getLabel()).toBe('Patient code');
    const paginator = await loader.getHarness(MatPaginatorHarness);
    expect(await paginator.getPageSize()).toBe(10);
  });

  it('writes a chosen filter to the address, back on the first page, and reloads', async () => {
    await open('/cases?page=3&sort=operator&direction=asc');
    const status = await loader.getHarness(MatSelectHarness.with({ selector: '[formControlName="status"]' }));
    await status.open();
    await status.clickOptions({ text: 'In recall' });
    await settle();

    expect(router.url).toBe('/cases?sort=operator&direction=asc&status=in-recall');
    const request = lastListRequest();
    expect(paramsOf(request)).toMatchObject({ page: '0', status: 'in-recall', sort: 'operator' });
    request.flush({ items: [], total: 0 });
    await settle();
    expect(harness.routeNativeElement?.textContent).toContain('No case matches these filters.');
  });

  it('puts a sort and a page change in the address', async () => {
    await open('/cases', 'audit_lead', 60);
    const sort = await loader.getHarness(MatSortHarness);
    const [operatorHeader] = await sort.getSortHeaders({ label: 'Operator' });
    await operatorHeader?.click();
    await settle();
    expect(router.url).toBe('/cases?sort=operator&direction=asc');
    lastListRequest().flush({ items: ITEMS, total: 60 });
    await settle();

    const paginator = await loader.getHarness(MatPaginatorHarness);
    await paginator.goToNextPage();
    await settle();
    expect(router.url).toBe('/cases?page=1&sort=operator&direction=asc');
    const pageRequest = lastListRequest();
    expect(paramsOf(pageRequest)).toMatchObject({ page: '1', sort: 'operator', direction: 'asc' });
    pageRequest.flush({ items: ITEMS, total: 60 });
    await settle();
    expect(await paginator.getRangeLabel()).toBe('26 – 50 of 60');
  });

  it('drops a filter when its chip is removed', async () => {
    await open('/cases?operatorId=6&phenotype=thin');
    const chip = await loader.getHarness(MatChipHarness.with({ text: /Operator: Ola Brandt/ }));
    await chip.remove();
    await settle();
    expect(router.url).toBe('/cases?phenotype=thin');
    lastListRequest().flush({ items: ITEMS, total: 1 });
  });

  it('shows labels and state words, and opens the case from its row', async () => {
    await open('/cases');
    const table = await loader.getHarness(MatTableHarness);
    const cells = await table.getCellTextByColumnName();
    expect(cells['procedure']?.text).toEqual(['Gingivectomy / gingivoplasty']);
    expect(cells['teeth']?.text).toEqual(['21, 22']);
    expect(cells['status']?.text).toEqual(['event_repeatIn recall']);

    const [row] = await table.getRows();
    await (await row?.host())?.click();
    await settle();
    expect(router.url).toBe('/cases/12');
  });

  it('offers "New case" to recording roles only', async () => {
    await open('/cases', 'partner');
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /New case/ }))).toHaveLength(0);
  });

  it("leaves operator filter and column out for a clinician's own list", async () => {
    await open('/cases', 'clinician');
    await loader.getHarness(MatButtonHarness.with({ text: /New case/ }));
    const table = await loader.getHarness(MatTableHarness);
    const [headerRow] = await table.getHeaderRows();
    expect(await headerRow?.getCellTextByIndex()).not.toContain('Operator');
    expect(await loader.getAllHarnesses(MatSelectHarness.with({ selector: '[formControlName="operatorId"]' }))).toHaveLength(0);
  });
});
