import { fileTypeFromBuffer } from 'file-type';
import type { Response } from 'supertest';
import type { ClinicalWorld } from '../support/clinical-fixtures';
import type { ApiClient } from '../support/test-app';
import { listApiRoutes, parseRouteKey, routeKey } from '../support/route-inventory';
import { ACTORS, ROUTE_ACCESS, type Actor } from './route-access-table';
import { closeRouteSweep, openRouteSweep, type RouteCallContext, perform } from './route-call-context';
import { ROUTE_CALLS } from './route-calls';

/*
 * Every API answer, route by route, called by someone the access table lets through:
 *  - Cache-Control (OWASP ASVS 5.0 14.2.2, sensitive data not kept by caches; RFC 9111 §5.2.2.5
 *    no-store): `no-store`, set for the whole /api router by server/app.ts, except the routes
 *    below that replace it with `private, no-cache` (RFC 9111 §5.2.2.4, §5.2.2.7: no shared cache,
 *    and revalidated on every use) and the health check, mounted before it, which carries no data;
 *  - Content-Type (ASVS 5.0 4.1.1): it matches the body, with `charset=utf-8` on every text type
 *    (JSON, CSV; IANA media types), and binary files are what they say (magic bytes, via file-type).
 */

/** Routes whose answers may be revalidated rather than never stored, and why (see the route files). */
const CACHE_CONTROL_EXCEPTIONS: Readonly<Record<string, string | undefined>> = {
  // No data but "ok": mounted before the no-store default so a load balancer may probe it freely.
  'GET /api/health': undefined,
  // server/routes/photos.routes.ts: ETag revalidation, never from a shared cache.
  'GET /api/photos/:id': 'private, no-cache',
  'GET /api/photos/:id/thumbnail': 'private, no-cache',
  // server/routes/audits.routes.ts: per-viewer results, revalidated (304 when unchanged).
  'GET /api/audits/:id/results': 'private, no-cache',
};

const JSON_TYPE = 'application/json; charset=utf-8';
const CSV_TYPE = 'text/csv; charset=utf-8';
const XLSX_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';

/** Routes that answer a file rather than JSON: the exact Content-Type, or 'image' for a photograph (its own type). */
const FILE_ANSWERS: Readonly<Record<string, string>> = {
  'GET /api/photos/:id': 'image',
  'GET /api/photos/:id/thumbnail': 'image',
  'GET /api/exports/:jobId/file': XLSX_TYPE,
  'GET /api/imports/template.xlsx': XLSX_TYPE,
  'GET /api/imports/template.csv': CSV_TYPE,
  'GET /api/imports/:jobId/errors.csv': CSV_TYPE,
};

const SIGNED_IN: readonly Actor[] = ACTORS.filter((actor) => actor !== 'anonymous');

describe('API answer headers: no-store and a Content-Type with its charset on every route (ASVS 5.0 14.2.2, 4.1.1)', () => {
  let world: ClinicalWorld;
  let context: RouteCallContext;

  beforeAll(async () => {
    ({ world, context } = await openRouteSweep());
  });
  afterAll(async () => {
    await closeRouteSweep(world);
  });

  it('covers every route the app registers, and names only real routes as exceptions', () => {
    const registered = listApiRoutes(world.t).map(routeKey).sort();
    expect(Object.keys(ROUTE_ACCESS).sort()).toEqual(registered);
    for (const key of [...Object.keys(CACHE_CONTROL_EXCEPTIONS), ...Object.keys(FILE_ANSWERS)]) expect(registered, key).toContain(key);
  });

  /** Checks Content-Type against the body of an answer that has one. */
  async function expectTypedBody(key: string, response: Response, client: ApiClient, url: string): Promise<void> {
    const contentType = String(response.headers['content-type'] ?? '');
    const file = FILE_ANSWERS[key];
    if (file === undefined) {
      expect(contentType, key).toBe(JSON_TYPE);
      expect(() => JSON.parse(response.text), key).not.toThrow();
      return;
    }
    if (file === CSV_TYPE) {
      expect(contentType, key).toBe(CSV_TYPE);
      expect(() => new TextDecoder('utf-8', { fatal: true }).decode(Buffer.from(response.text, 'utf8')), key).not.toThrow();
      return;
    }
    // Binary: the type must be what the bytes are (file-type reads the magic numbers); read again, whole.
    const bytes = (await client.getBytes(url)).body as Buffer;
    const detected = await fileTypeFromBuffer(bytes);
    if (file === 'image') expect(contentType, key).toMatch(/^image\/(jpeg|png|webp)$/);
    else expect(contentType, key).toBe(file);
    expect(detected?.mime, key).toBe(contentType);
  }

  for (const [key, expected] of Object.entries(ROUTE_ACCESS)) {
    // Someone the role check lets through: a success, or a refusal of the service itself (a backup on PostgreSQL: 409).
    const actor = SIGNED_IN.find((candidate) => expected[candidate] < 300 || expected[candidate] === 409);
    const cacheControl = key in CACHE_CONTROL_EXCEPTIONS ? CACHE_CONTROL_EXCEPTIONS[key] : 'no-store';
    it(`${key} as ${actor ?? 'nobody'}: Cache-Control ${cacheControl ?? '(none)'}, Content-Type matching the body (charset on text)`, async () => {
      if (!actor) throw new Error(`No signed-in actor may call ${key}.`);
      const { method } = parseRouteKey(key);
      const call = await ROUTE_CALLS[key](context, actor, 'other');
      const client = call.client ?? world.as(actor);
      const response = await perform(client, method, call);
      await world.t.exports.idle();
      await world.t.imports.idle();
      expect(response.status, JSON.stringify(response.body)).toBe(expected[actor]);
      expect(response.headers['cache-control'], key).toBe(cacheControl);
      if (response.status === 204) {
        expect(response.headers['content-type'], key).toBeUndefined();
        expect(response.text ?? '', key).toBe('');
      } else {
        await expectTypedBody(key, response, client, call.url);
      }
    });
  }

  it('marks refusals and errors no-store and JSON with its charset too (401, 403, 404, 400, CSRF 403)', async () => {
    const answers: [string, Response][] = [
      ['401', await world.as('anonymous').get('/api/cases')],
      ['403', await world.as('governance').get('/api/cases')],
      ['404 unknown route', await world.as('audit_lead').get('/api/no-such-thing')],
      ['404 unknown record', await world.as('audit_lead').get('/api/cases/999999')],
      ['400', await world.as('audit_lead').get('/api/cases/not-a-number')],
      ['403 csrf', await world.as('audit_lead').agent.post('/api/patients').send({})],
    ];
    for (const [what, response] of answers) {
      expect(response.status, what).toBe(Number(what.slice(0, 3)));
      expect(response.headers['cache-control'], what).toBe('no-store');
      expect(response.headers['content-type'], what).toBe(JSON_TYPE);
      expect(response.body.error.code, what).toEqual(expect.any(String));
    }
  });

  it('answers a body that is not JSON with the fixed sentence only (refused by the parser before the /api router, so without no-store)', async () => {
    const lead = world.as('audit_lead');
    const response = await lead.agent.post('/api/patients').set('X-XSRF-TOKEN', lead.xsrf).set('Content-Type', 'application/json').send('{"code":');
    expect(response.status).toBe(400);
    expect(response.headers['content-type']).toBe(JSON_TYPE);
    expect(response.body).toEqual({ error: { code: 'validation', message: 'The request body is not valid JSON.' } });
    // No data to keep, and 400 is not heuristically cacheable (RFC 9110 §15.1, RFC 9111 §4.2.2); no-store would do no harm either.
    expect([undefined, 'no-store']).toContain(response.headers['cache-control']);
  });
});
