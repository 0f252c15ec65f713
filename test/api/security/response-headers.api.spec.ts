import sharp from 'sharp';
import type { PhotoView } from '@tidemark/shared';
import { createCase, createClinicalWorld, expectStatus, type ClinicalWorld } from '../support/clinical-fixtures';

/**
 * Browser-facing headers on API answers (OWASP ASVS 5.0 V3.4 browser security mechanism
 * headers, V14.3 client-side data protection). helmet 8 sets most of them; these tests
 * pin the values so a change of library or option cannot drop one silently.
 */
describe('response headers', () => {
  let w: ClinicalWorld;
  beforeAll(async () => {
    w = await createClinicalWorld();
  });
  afterAll(async () => {
    await w.close();
  });

  it('sends HSTS, nosniff, no referrer, no framing and a script policy of our own origin only', async () => {
    const response = await w.as('audit_lead').get('/api/cases');
    expect(response.status).toBe(200);
    expect(response.headers['strict-transport-security']).toBe('max-age=31536000; includeSubDomains');
    expect(response.headers['x-content-type-options']).toBe('nosniff');
    expect(response.headers['referrer-policy']).toBe('no-referrer');
    expect(response.headers['cross-origin-opener-policy']).toBe('same-origin');
    expect(response.headers['x-powered-by']).toBeUndefined();
    const policy = String(response.headers['content-security-policy']);
    expect(policy).toContain("frame-ancestors 'self'");
    expect(policy).toContain("script-src 'self'");
    expect(policy).toContain("object-src 'none'");
    expect(policy).not.toMatch(/script-src[^;]*unsafe-inline/);
  });

  it('keeps clinical JSON out of browser and proxy caches', async () => {
    for (const url of ['/api/cases', '/api/auth/me', '/api/history']) {
      const response = await w.as('audit_lead').get(url);
      expect(response.status, url).toBe(200);
      expect(response.headers['cache-control'], url).toBe('no-store');
    }
    const refused = await w.as('anonymous').get('/api/cases');
    expect(refused.status).toBe(401);
    expect(refused.headers['cache-control']).toBe('no-store');
  });

  it('lets a photograph be revalidated (ETag, 304) but never reused unchecked', async () => {
    const found = await createCase(w.as('clinician'), w.ids.clinician);
    const png = await sharp({ create: { width: 8, height: 8, channels: 3, background: '#58a' } }).png().toBuffer();
    const photo = expectStatus(await w.as('clinician').upload(`/api/cases/${found.id}/photos`, { kind: 'recall' }, { bytes: png, filename: 'p.png', contentType: 'image/png' }), 201).body as PhotoView;
    const first = await w.as('clinician').get(`/api/photos/${photo.id}`);
    expect(first.status).toBe(200);
    expect(first.headers['cache-control']).toBe('private, no-cache');
    const etag = first.headers.etag as string;
    expect(etag).toBeTruthy();
    const again = await w.as('clinician').agent.get(`/api/photos/${photo.id}`).set('If-None-Match', etag);
    expect(again.status).toBe(304);
  });
});
