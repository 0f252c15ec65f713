import fc from 'fast-check';
import { FIXTURE_STANDARDS } from '../api/support/audit-fixtures';
import { fuzzSettings } from './support/fuzz-settings';
import type { JsonRoute } from './support/fuzz-route';
import { FUZZ_ROUTES } from './support/fuzz-routes';
import type { FixtureIds } from './support/fuzz-world';
import { asParsed } from './support/json-text';
import { brokenBody, jsonSchemaOf, withNoise } from './support/schema-breaker';

/*
 * The fuzz suite's own guarantee, checked without a server: for every JSON route, the base body
 * is one the route's schema accepts, and every body the breaker derives from it is one the
 * schema refuses (as the server's JSON parser would hand it over). Otherwise a 2xx in the route
 * fuzz would be the generator's fault, not the server's.
 */

const settings = fuzzSettings();

/** Plausible ids; the schemas only look at their shape. */
const IDS: FixtureIds = {
  users: { admin: 1, audit_lead: 2, clinician: 3, partner: 4, governance: 5, other: 6 },
  patient: { id: 7, version: 1, code: 'TM-0007' },
  case: { id: 8, version: 2 },
  site: { id: 9, version: 1 },
  visit: { id: 10, version: 1 },
  complication: { id: 11, version: 1 },
  defaultSchedule: 1,
  schedule: { id: 2, version: 1 },
  audit: { id: 3, version: 1 },
  standard: { ...FIXTURE_STANDARDS[0], id: 4, auditId: 3, position: 1, intervalKey: '6m', thresholdMm: null, thresholdPct: null, minGrade: null, evidenceSource: 'Arora et al. 2013', exceptions: '', version: 1 },
  cycle: { id: 5, version: 1 },
  action: { id: 6, version: 1 },
  sentMessage: 1,
};

const jsonRoutes = FUZZ_ROUTES.filter((route): route is JsonRoute => route.body === 'json');

describe('fuzz generators', () => {
  for (const route of jsonRoutes) {
    describe(`${route.method} ${route.path}`, () => {
      it('starts from a body the schema accepts', () => {
        const parsed = route.schema.safeParse(asParsed(route.validBody(IDS)));
        expect(parsed.success, JSON.stringify(parsed.error?.issues)).toBe(true);
      });

      it('derives only bodies the schema refuses', () => {
        const node = jsonSchemaOf(route.schema);
        const bodies = brokenBody(node, route.validBody(IDS)).chain((body) => withNoise(node, body));
        fc.assert(
          fc.property(bodies, (body) => !route.schema.safeParse(asParsed(body)).success),
          { numRuns: settings.runs, seed: settings.seed },
        );
      });
    });
  }
});
