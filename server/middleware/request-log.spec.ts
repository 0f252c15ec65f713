import type { IncomingMessage, ServerResponse } from 'node:http';
import { pathOnly, requestLogProps, requestLogSerializers } from './request-log';

describe('request log lines', () => {
  it('drop the query string, which can hold a patient code', () => {
    expect(requestLogSerializers.req({ method: 'GET', url: '/api/patients?code=TM-0042' })).toEqual({ method: 'GET', path: '/api/patients' });
    expect(pathOnly('/api/cases?patientCode=TM-0042&page=2')).toBe('/api/cases');
    expect(pathOnly('/api/cases#top')).toBe('/api/cases');
    expect(pathOnly('/api/cases/7')).toBe('/api/cases/7');
  });

  it('name the signed-in member by id only', () => {
    const res = {} as ServerResponse;
    expect(requestLogProps({ user: { id: 12, email: 'lead@example.org' } } as unknown as IncomingMessage, res)).toEqual({ userId: 12 });
    expect(requestLogProps({} as IncomingMessage, res)).toEqual({});
  });
});
