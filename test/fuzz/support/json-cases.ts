import fc from 'fast-check';
import { BAD_ENCODING_HEADERS, NON_JSON_CONTENT_TYPES, anyJsonValue, malformedIdSegment, malformedJsonText, missingIdSegment } from '../generators';
import { ANY_4XX, FuzzCase, type CsrfVariant, type FuzzMode } from './fuzz-case';
import type { BodilessRoute, FuzzRoute, JsonRoute } from './fuzz-route';
import type { FixtureIds } from './fuzz-world';
import { toJsonText, type FuzzValue } from './json-text';
import { brokenBody, jsonSchemaOf, withNoise } from './schema-breaker';

/** A weighted generator of cases (fast-check `oneof` entries). */
export type WeightedCases = { arbitrary: fc.Arbitrary<FuzzCase>; weight: number }[];

const JSON_TYPE = { 'content-type': 'application/json' };
const CSRF_VARIANTS: CsrfVariant[] = ['missing', 'garbage', 'cross-site-origin', 'cross-site-fetch'];
/** Over express.json's 1 MB limit (server/app.ts). */
const OVERSIZE_TEXT = `{"pad":"${'x'.repeat(1_100_000)}"}`;

const statuses = (...codes: number[]): ReadonlySet<number> => new Set(codes);

/** A Content-Type header, or none for `''`. */
function contentType(type: string): Record<string, string> {
  return type ? { 'content-type': type } : {};
}

/** The route's path with `:id` filled in (routes without an id keep their path). */
export function routePath(route: FuzzRoute, segment: string | number | undefined): string {
  return segment === undefined ? route.path : route.path.replace(':id', String(segment));
}

function bytes(text: string): Buffer {
  return Buffer.from(text, 'utf8');
}

/** `a=1&b=...` from the valid body, as a form would send it. */
function formEncoded(body: FuzzValue): string {
  if (typeof body !== 'object' || body === null || Array.isArray(body)) return 'body=1';
  return Object.entries(body)
    .map(([key, value]) => `${encodeURIComponent(key)}=${encodeURIComponent(typeof value === 'string' ? value : toJsonText(value))}`)
    .join('&');
}

/** Cases shared by every route: refused actors and CSRF failures on the real record, malformed ids, unknown ids. */
export function accessCases(route: FuzzRoute, ids: FixtureIds, validRequest: (path: string) => { headers: Record<string, string>; body?: Buffer }): WeightedCases {
  const existing = route.existingId?.(ids);
  const onRecord = routePath(route, existing);
  const make = (mode: FuzzMode, path: string, allowed: ReadonlySet<number>, csrf: CsrfVariant = 'valid', actor = route.actor) =>
    new FuzzCase(mode, { method: route.method, path, ...validRequest(path) }, allowed, actor, csrf);
  const cases: WeightedCases = [{ arbitrary: fc.constantFrom(...CSRF_VARIANTS).map((csrf) => make('csrf', onRecord, statuses(403), csrf)), weight: 4 }];
  if (route.refusedActors.length) cases.push({ arbitrary: fc.constantFrom(...route.refusedActors).map((actor) => make('actor', onRecord, statuses(401, 403, 404), 'valid', actor)), weight: 6 });
  if (existing !== undefined) {
    cases.push(
      { arbitrary: malformedIdSegment(existing).map((segment) => make('param', routePath(route, segment), statuses(400, 404))), weight: 12 },
      { arbitrary: missingIdSegment.map((segment) => make('missing-id', routePath(route, segment), statuses(404))), weight: 6 },
    );
  }
  return cases;
}

/** Cases whose body never reaches the route: the JSON parser refuses it first (bad text, size, charset, encoding). */
function parserCases(route: FuzzRoute, path: string, validText: string): WeightedCases {
  const make = (mode: FuzzMode, headers: Record<string, string>, text: string, allowed: ReadonlySet<number>) => new FuzzCase(mode, { method: route.method, path, headers, body: bytes(text) }, allowed, route.actor);
  return [
    { arbitrary: malformedJsonText(validText).map((text) => make('malformed-json', JSON_TYPE, text, statuses(400))), weight: 8 },
    { arbitrary: fc.constantFrom(...BAD_ENCODING_HEADERS).map((headers) => make('encoding', headers, validText, statuses(400, 415))), weight: 3 },
    { arbitrary: fc.constant(make('oversize', JSON_TYPE, OVERSIZE_TEXT, statuses(413))), weight: 1 },
  ];
}

/** Cases for a route that validates a JSON body. */
export function jsonRouteCases(route: JsonRoute, ids: FixtureIds): fc.Arbitrary<FuzzCase> {
  const node = jsonSchemaOf(route.schema);
  const valid = route.validBody(ids);
  const validText = toJsonText(valid);
  const path = routePath(route, route.existingId?.(ids));
  const send = (mode: FuzzMode, body: FuzzValue, allowed: ReadonlySet<number>, at = path) => new FuzzCase(mode, { method: route.method, path: at, headers: JSON_TYPE, body: bytes(toJsonText(body)) }, allowed, route.actor);
  const broken = brokenBody(node, valid).chain((body) => withNoise(node, body));
  const cases: WeightedCases = [
    { arbitrary: broken.map((body) => send('body', body, statuses(400))), weight: 45 },
    {
      arbitrary: fc.tuple(fc.constantFrom(...NON_JSON_CONTENT_TYPES), fc.constantFrom(validText, formEncoded(valid))).map(
        ([type, text]) => new FuzzCase('content-type', { method: route.method, path, headers: contentType(type), body: bytes(text) }, statuses(415), route.actor),
      ),
      weight: 8,
    },
    ...parserCases(route, path, validText),
    ...accessCases(route, ids, () => ({ headers: JSON_TYPE, body: bytes(validText) })),
  ];
  const refused = route.refused?.(ids);
  if (refused) {
    cases.push({
      arbitrary: refused.chain(({ id, body }) => withNoise(node, body ?? valid).map((noisy) => send('refused', noisy, ANY_4XX, routePath(route, id ?? route.existingId?.(ids))))),
      weight: 12,
    });
  }
  return fc.oneof(...cases);
}

/** Cases for a route without a body: its id, its actor, and bodies the parser must refuse or the route ignore. */
export function bodilessRouteCases(route: BodilessRoute, ids: FixtureIds): fc.Arbitrary<FuzzCase> {
  const path = routePath(route, route.existingId?.(ids));
  const sample = toJsonText({ reason: 'x' });
  const cases: WeightedCases = [...parserCases(route, path, sample), ...accessCases(route, ids, () => ({ headers: {} }))];
  const refused = route.refused?.(ids);
  if (refused) {
    cases.push({ arbitrary: refused.map(({ id }) => new FuzzCase('refused', { method: route.method, path: routePath(route, id), headers: {} }, ANY_4XX, route.actor)), weight: 10 });
  }
  if (route.acceptsIgnoredBody) {
    const anyBody = fc.oneof(
      anyJsonValue.map((value) => ({ headers: contentType('application/json'), text: toJsonText(Array.isArray(value) || (typeof value === 'object' && value !== null) ? value : [value]) })),
      fc.tuple(fc.constantFrom(...NON_JSON_CONTENT_TYPES), anyJsonValue).map(([type, value]) => ({ headers: contentType(type), text: toJsonText(value) })),
    );
    cases.push({
      arbitrary: anyBody.map(({ headers, text }) => new FuzzCase('ignored-body', { method: route.method, path, headers, body: bytes(text) }, ANY_4XX, route.actor, 'valid', true)),
      weight: 30,
    });
  }
  return fc.oneof(...cases);
}
