import fc from 'fast-check';
import type * as z from 'zod';
import { nastyString, unicodeString } from '../generators';
import type { Actor, FixtureIds } from './fuzz-world';
import type { FuzzValue } from './json-text';

/** The write methods the suite covers (PUT has no route today; a new one fails the completeness test). */
export type WriteMethod = 'POST' | 'PATCH' | 'PUT' | 'DELETE';

/** A body the schema accepts but the service must refuse (a stale version, an unknown reference, a duplicate). */
export interface RefusedInput {
  /** The `:id` to send to (the route's fixture record when left out). */
  id?: number;
  body?: FuzzValue;
}

interface RouteCommon {
  method: WriteMethod;
  /** Express path with `:id` where the route has one. */
  path: string;
  /** Which world the route runs in (one app per group). */
  group: 'auth' | 'team' | 'clinical' | 'audits' | 'mail' | 'imports';
  /** Who sends the fuzz (allowed to write, so only the input decides). */
  actor: Actor;
  /** Actors the route must refuse even with a valid body on the real record. */
  refusedActors: Actor[];
  existingId?: (ids: FixtureIds) => number;
  refused?: (ids: FixtureIds) => fc.Arbitrary<RefusedInput>;
}

/** A route that reads a JSON body through `validateBody(schema)`. */
export interface JsonRoute extends RouteCommon {
  body: 'json';
  schema: z.ZodType;
  /** A body the route accepts as it is (sent only where something else makes the request invalid). */
  validBody: (ids: FixtureIds) => FuzzValue;
}

/** A route that takes no body (DELETE, actions). */
export interface BodilessRoute extends RouteCommon {
  body: 'none';
  /** Why answering 2xx to an ignored body is right (only for routes with nothing to validate). */
  acceptsIgnoredBody?: string;
  /** The route ends the session it is sent with: every case gets a new anonymous one. */
  needsFreshSession?: boolean;
}

/** A multipart upload route. */
export interface UploadRoute extends RouteCommon {
  body: 'photo' | 'import';
}

/** One entry of the route table. */
export type FuzzRoute = JsonRoute | BodilessRoute | UploadRoute;

/** A plain JSON copy of a typed request body (drops undefined keys, as the wire would). */
export function plainJson(value: object): FuzzValue {
  return JSON.parse(JSON.stringify(value));
}

/** Free text the schema accepts (3–`max` characters after trimming) but full of hostile content. */
export function hostileText(max: number): fc.Arbitrary<string> {
  return fc.oneof(nastyString, unicodeString).map((text) => `Fix ${text} ok`.slice(0, max));
}

/** A stale version: any valid version except the current one. */
export function staleVersion(current: number): fc.Arbitrary<number> {
  return fc.oneof(fc.integer({ min: current + 1, max: 2 ** 31 }), fc.constant(Number.MAX_SAFE_INTEGER));
}

/** Six digits: the shape of a one-time code (RFC 6238), never the right one for a session that expects none. */
export const sixDigits = fc.integer({ min: 0, max: 999_999 }).map((value) => String(value).padStart(6, '0'));
/** Canonical ids far above every fixture id. */
export const MISSING_ID = fc.integer({ min: 1_000_000, max: 2 ** 31 });
/** Who may not write clinical records (DESIGN.md §2). */
export const CLINICAL_REFUSED: Actor[] = ['anonymous', 'governance', 'partner'];
/** Who may not define audits (only the audit lead may, DESIGN.md §2). */
export const AUDIT_REFUSED: Actor[] = ['anonymous', 'clinician', 'partner', 'governance', 'admin'];
