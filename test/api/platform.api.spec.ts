import request from 'supertest';
import { createTestApp, type TestApp } from './support/test-app';

describe('health and unknown paths', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(async () => {
    await t.close();
  });

  it('GET /api/health answers ok after a database query, without signing in', async () => {
    const response = await request(t.app).get('/api/health');
    expect(response.status).toBe(200);
    expect(response.body).toEqual({ status: 'ok' });
  });

  it('answers a JSON 404 for an unknown /api path', async () => {
    const response = await request(t.app).get('/api/no-such-thing');
    expect(response.status).toBe(404);
    expect(response.headers['content-type']).toMatch(/json/);
    expect(response.body.error.code).toBe('not_found');
  });

  it('sends a Content-Security-Policy that allows only our own scripts', async () => {
    const response = await request(t.app).get('/api/health');
    expect(response.headers['content-security-policy']).toMatch(/script-src 'self'(;|$)/);
    expect(response.headers['x-powered-by']).toBeUndefined();
  });

  it('answers 503 when the database is gone', async () => {
    const broken = await createTestApp();
    try {
      await broken.dataSource.destroy();
      const response = await request(broken.app).get('/api/health');
      expect(response.status).toBe(503);
      expect(response.body.error.code).toBe('unavailable');
    } finally {
      // Deletes the throwaway database (on PostgreSQL a whole database would otherwise be left behind).
      await broken.close();
    }
  });
});
