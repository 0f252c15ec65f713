/*
 * Who may call which API route: the one table the access matrix, the CSRF sweep and the
 * governance privacy scan read. Keys are `"METHOD /api/path/:param"` exactly as
 * test/api/support/route-inventory.ts lists them; the matrix spec fails on any route missing
 * here and on any key whose route is gone.
 *
 * Sources: DESIGN.md §2 (roles table; sign-in required for everything but sign-in and
 * /api/health), the role checks in server/services/clinical-access.ts, audit-access.ts and
 * the routes' requireRole lists. Rules the table encodes:
 *  - anonymous: 401 everywhere except health and sign-in (sign-out of nobody is a harmless 204);
 *  - own password, sessions and one-time codes: every signed-in person manages their own (set up, verify, new recovery
 *    codes, switch off); only the admin resets someone else's;
 *  - patient-level records (patients, cases, sites, visits, complications, photos): admin and
 *    partner read, never write (403); governance 403 (de-identified results only);
 *  - `clinician` acts on a case operated by ANOTHER clinician: 404 (its existence is not theirs
 *    to know); `clinicianOwnCase` is the same call on a case they operate;
 *  - audits, schedules, standards, cycles, actions: the audit lead writes; results are read by
 *    everyone but admin (403); review notes by the lead and partners only;
 *  - governance workbook: lead, partner, governance; send-pack: lead; imports: lead; outbox,
 *    team and settings: admin;
 *  - the Today list (recalls due): those who enter recalls (lead, clinician).
 */

import { IS_POSTGRES_SCHEMA } from '../../../server/entities/column-types';

/** Who makes the call. */
export const ACTORS = ['anonymous', 'admin', 'audit_lead', 'partner', 'governance', 'clinician'] as const;
export type Actor = (typeof ACTORS)[number];

/** Expected HTTP status per actor; `clinicianOwnCase` only on routes that target one case. */
export type ExpectedStatuses = Readonly<Record<Actor, number>> & { readonly clinicianOwnCase?: number };

/** Positional builder, in the order of {@link ACTORS}, then the clinician on their own case. */
function s(anonymous: number, admin: number, audit_lead: number, partner: number, governance: number, clinician: number, clinicianOwnCase?: number): ExpectedStatuses {
  return { anonymous, admin, audit_lead, partner, governance, clinician, ...(clinicianOwnCase === undefined ? {} : { clinicianOwnCase }) };
}

//                                                    anon admin lead partner gov  clin  own case
export const ROUTE_ACCESS: Readonly<Record<string, ExpectedStatuses>> = {
  'GET /api/health': /*                             */ s(200, 200, 200, 200, 200, 200),

  'POST /api/auth/login': /*                        */ s(200, 200, 200, 200, 200, 200),
  'GET /api/auth/me': /*                            */ s(401, 200, 200, 200, 200, 200),
  'POST /api/auth/logout': /*                       */ s(204, 204, 204, 204, 204, 204),
  'GET /api/auth/sign-in-options': /*               */ s(200, 200, 200, 200, 200, 200),
  'POST /api/auth/password': /*                     */ s(401, 200, 200, 200, 200, 200),
  'GET /api/auth/sessions': /*                      */ s(401, 200, 200, 200, 200, 200),
  'POST /api/auth/sessions/end-others': /*          */ s(401, 200, 200, 200, 200, 200),
  'DELETE /api/auth/sessions/:id': /*               */ s(401, 204, 204, 204, 204, 204),
  // One-time codes (server/routes/second-factor.routes.ts): each person for themselves; tests run the 'offered' policy.
  'GET /api/auth/second-factor': /*                 */ s(401, 200, 200, 200, 200, 200),
  'POST /api/auth/second-factor/enrolment': /*      */ s(401, 200, 200, 200, 200, 200),
  'POST /api/auth/second-factor/enrolment/confirm': s(401, 200, 200, 200, 200, 200),
  'POST /api/auth/second-factor/verify': /*         */ s(401, 200, 200, 200, 200, 200),
  'POST /api/auth/second-factor/recovery-codes': /* */ s(401, 200, 200, 200, 200, 200),
  'POST /api/auth/second-factor/disable': /*        */ s(401, 200, 200, 200, 200, 200),

  'GET /api/users': /*                              */ s(401, 200, 403, 403, 403, 403),
  'POST /api/users': /*                             */ s(401, 201, 403, 403, 403, 403),
  'PATCH /api/users/:id': /*                        */ s(401, 200, 403, 403, 403, 403),
  'DELETE /api/users/:id/second-factor': /*         */ s(401, 204, 403, 403, 403, 403),
  'DELETE /api/users/:id/sessions': /*              */ s(401, 200, 403, 403, 403, 403),
  'GET /api/operators': /*                          */ s(401, 200, 200, 200, 403, 200),

  'GET /api/patients': /*                           */ s(401, 200, 200, 200, 403, 200),
  'POST /api/patients': /*                          */ s(401, 403, 201, 403, 403, 201),
  'GET /api/patients/:id': /*                       */ s(401, 200, 200, 200, 403, 404, 200),
  'PATCH /api/patients/:id': /*                     */ s(401, 403, 200, 403, 403, 404, 200),

  'GET /api/cases': /*                              */ s(401, 200, 200, 200, 403, 200),
  'POST /api/cases': /*                             */ s(401, 403, 201, 403, 403, 201),
  'GET /api/cases/:id': /*                          */ s(401, 200, 200, 200, 403, 404, 200),
  'PATCH /api/cases/:id': /*                        */ s(401, 403, 200, 403, 403, 404, 200),
  'POST /api/cases/:id/sites': /*                   */ s(401, 403, 201, 403, 403, 404, 201),
  'POST /api/cases/:id/visits': /*                  */ s(401, 403, 201, 403, 403, 404, 201),
  'POST /api/cases/:id/complications': /*           */ s(401, 403, 201, 403, 403, 404, 201),
  'POST /api/cases/:id/photos': /*                  */ s(401, 403, 201, 403, 403, 404, 201),
  'PATCH /api/sites/:id': /*                        */ s(401, 403, 200, 403, 403, 404, 200),
  'PATCH /api/visits/:id': /*                       */ s(401, 403, 200, 403, 403, 404, 200),
  'PATCH /api/complications/:id': /*                */ s(401, 403, 200, 403, 403, 404, 200),
  'GET /api/photos/:id': /*                         */ s(401, 200, 200, 200, 403, 404, 200),
  'GET /api/photos/:id/thumbnail': /*               */ s(401, 200, 200, 200, 403, 404, 200),
  'POST /api/calibration-readings': /*              */ s(401, 403, 201, 403, 403, 404, 201),

  'GET /api/recalls/due': /*                        */ s(401, 403, 200, 403, 403, 200),
  'GET /api/history': /*                            */ s(401, 200, 200, 200, 403, 200),

  'GET /api/schedules': /*                          */ s(401, 403, 200, 200, 200, 200),
  'POST /api/schedules': /*                         */ s(401, 403, 201, 403, 403, 403),
  'PATCH /api/schedules/:id': /*                    */ s(401, 403, 200, 403, 403, 403),
  'DELETE /api/schedules/:id': /*                   */ s(401, 403, 204, 403, 403, 403),

  'GET /api/audits': /*                             */ s(401, 403, 200, 200, 200, 200),
  'POST /api/audits': /*                            */ s(401, 403, 201, 403, 403, 403),
  'POST /api/audits/cohort-preview': /*             */ s(401, 403, 200, 200, 200, 200),
  'GET /api/audits/:id': /*                         */ s(401, 403, 200, 200, 200, 200),
  'PATCH /api/audits/:id': /*                       */ s(401, 403, 200, 403, 403, 403),
  'DELETE /api/audits/:id': /*                      */ s(401, 403, 204, 403, 403, 403),
  'POST /api/audits/:id/standards': /*              */ s(401, 403, 201, 403, 403, 403),
  'POST /api/audits/:id/cycles': /*                 */ s(401, 403, 201, 403, 403, 403),
  'GET /api/audits/:id/notes': /*                   */ s(401, 403, 200, 200, 403, 403),
  'POST /api/audits/:id/notes': /*                  */ s(401, 403, 201, 201, 403, 403),
  'GET /api/audits/:id/results': /*                 */ s(401, 403, 200, 200, 200, 200),
  'GET /api/audits/:id/funnel': /*                  */ s(401, 403, 200, 200, 200, 200),
  'GET /api/audits/:id/trend': /*                   */ s(401, 403, 200, 200, 200, 200),
  'GET /api/audits/:id/survival': /*                */ s(401, 403, 200, 200, 200, 200),
  'GET /api/audits/:id/calibration': /*             */ s(401, 403, 200, 200, 200, 200),
  'GET /api/audits/:id/compare': /*                 */ s(401, 403, 200, 200, 200, 200),
  'POST /api/audits/:id/send-pack': /*              */ s(401, 403, 202, 403, 403, 403),
  'POST /api/audits/:id/exports': /*                */ s(401, 403, 202, 202, 202, 403),

  'PATCH /api/standards/:id': /*                    */ s(401, 403, 200, 403, 403, 403),
  'DELETE /api/standards/:id': /*                   */ s(401, 403, 204, 403, 403, 403),
  'PATCH /api/cycles/:id': /*                       */ s(401, 403, 200, 403, 403, 403),
  'DELETE /api/cycles/:id': /*                      */ s(401, 403, 204, 403, 403, 403),
  'POST /api/cycles/:id/actions': /*                */ s(401, 403, 201, 403, 403, 403),
  'PATCH /api/actions/:id': /*                      */ s(401, 403, 200, 403, 403, 403),
  'DELETE /api/actions/:id': /*                     */ s(401, 403, 204, 403, 403, 403),

  'GET /api/exports/:jobId': /*                     */ s(401, 403, 200, 200, 200, 403),
  'GET /api/exports/:jobId/file': /*                */ s(401, 403, 200, 200, 200, 403),

  'GET /api/imports/template.xlsx': /*              */ s(401, 403, 200, 403, 403, 403),
  'GET /api/imports/template.csv': /*               */ s(401, 403, 200, 403, 403, 403),
  'POST /api/imports': /*                           */ s(401, 403, 202, 403, 403, 403),
  'GET /api/imports/:jobId': /*                     */ s(401, 403, 200, 403, 403, 403),
  'GET /api/imports/:jobId/errors.csv': /*          */ s(401, 403, 200, 403, 403, 403),

  'GET /api/outbox': /*                             */ s(401, 200, 403, 403, 403, 403),
  'POST /api/outbox/run': /*                        */ s(401, 200, 403, 403, 403, 403),
  'POST /api/outbox/:id/retry': /*                  */ s(401, 200, 403, 403, 403, 403),

  // The installation overview and backups (server/routes/settings.routes.ts): admin only. A backup
  // copies the SQLite file, so on PostgreSQL the admin, past the role check, is answered 409.
  'GET /api/settings/system': /*                    */ s(401, 200, 403, 403, 403, 403),
  'POST /api/settings/backups': /*                  */ s(401, IS_POSTGRES_SCHEMA ? 409 : 201, 403, 403, 403, 403),
};

/** The error code each refusal carries (shared/types/api-error.ts). */
export const REFUSAL_CODES: Readonly<Record<number, string>> = { 401: 'unauthenticated', 403: 'forbidden', 404: 'not_found', 409: 'conflict' };
