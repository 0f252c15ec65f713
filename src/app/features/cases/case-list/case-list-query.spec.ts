import { convertToParamMap } from '@angular/router';
import type { CaseListQuery } from '@tidemark/shared';
import { DEFAULT_CASE_LIST_QUERY, caseListQueryParams, isSameCaseListQuery, readCaseListQuery } from './case-list-query';

describe('case list query in the address', () => {
  it('survives a round trip through query parameters', () => {
    const query: CaseListQuery = {
      page: 3,
      pageSize: 50,
      sort: 'operator',
      direction: 'asc',
      operatorId: 6,
      procedure: 'apf-osseous-recontouring',
      status: 'withdrawn',
      phenotype: 'thin',
      from: '2025-06-01',
      to: '2025-12-31',
      tooth: 13,
      patientCode: 'TST-00',
    };
    const params = caseListQueryParams(query);
    const stringified = Object.fromEntries(Object.entries(params).map(([key, value]) => [key, String(value)]));
    expect(readCaseListQuery(convertToParamMap(stringified))).toEqual(query);
  });

  it('leaves defaults out so a plain /cases means "everything, newest first"', () => {
    expect(caseListQueryParams(DEFAULT_CASE_LIST_QUERY)).toEqual({});
    expect(DEFAULT_CASE_LIST_QUERY).toMatchObject({ page: 0, sort: 'surgeryDate', direction: 'desc' });
  });

  it('drops only the values the server would refuse', () => {
    const query = readCaseListQuery(
      convertToParamMap({ tooth: '19', status: 'lost', from: '2026-02-30', pageSize: '5000', sort: 'secret', procedure: 'gingivectomy' }),
    );
    expect(query.tooth).toBeUndefined();
    expect(query.status).toBeUndefined();
    expect(query.from).toBeUndefined();
    expect(query.pageSize).toBe(DEFAULT_CASE_LIST_QUERY.pageSize);
    expect(query.sort).toBe('surgeryDate');
    expect(query.procedure).toBe('gingivectomy');
  });

  it('compares queries by what they ask the server', () => {
    expect(isSameCaseListQuery({ ...DEFAULT_CASE_LIST_QUERY, patientCode: '' }, DEFAULT_CASE_LIST_QUERY)).toBe(true);
    expect(isSameCaseListQuery({ ...DEFAULT_CASE_LIST_QUERY, tooth: 21 }, DEFAULT_CASE_LIST_QUERY)).toBe(false);
  });
});
