import type { Response } from 'supertest';
import type { ClinicalWorld } from './clinical-fixtures';
import { storeFingerprint } from './audit-fixtures';
import type { ApiClient } from './test-app';

/**
 * Kinds of audit route (DESIGN.md §2 and server/services/audit-access.ts):
 * - read: dashboards — audit lead, partner, governance, clinician; admin 403;
 * - write: define audits, schedules, standards, cycles, actions — audit lead only;
 * - note: review notes — audit lead and partner only (read and write);
 * - reading: calibration readings on a case — those who may write the case (the lead; the clinician on their own case).
 */
export type AuditAccessKind = 'read' | 'write' | 'note' | 'reading';

export const AUDIT_ACTORS = ['anonymous', 'admin', 'audit_lead', 'partner', 'governance', 'clinician'] as const;
export type AuditActor = (typeof AUDIT_ACTORS)[number];

/** A route under test; `prepare` makes a fresh target (as the audit lead) and returns the call. */
export interface AuditAccessRoute {
  name: string;
  kind: AuditAccessKind;
  /** True when a successful call stores something (POST/PATCH/DELETE other than the cohort preview). */
  isWrite: boolean;
  success: number;
  prepare(world: ClinicalWorld): Promise<(client: ApiClient) => Promise<Response>>;
}

/** Expected status per DESIGN.md §2 (sign-in required for everything: anonymous 401). */
export function expectedAuditStatus(kind: AuditAccessKind, actor: AuditActor, success: number): number {
  if (actor === 'anonymous') return 401;
  switch (kind) {
    case 'read':
      return actor === 'admin' ? 403 : success;
    case 'write':
      return actor === 'audit_lead' ? success : 403;
    case 'note':
      return actor === 'audit_lead' || actor === 'partner' ? success : 403;
    case 'reading':
      return actor === 'audit_lead' || actor === 'clinician' ? success : 403;
  }
}

/** One test per route and actor; refused calls (and every read) must leave the database as it was. */
export function describeAuditAccess(world: () => ClinicalWorld, routes: AuditAccessRoute[]): void {
  for (const route of routes) {
    describe(route.name, () => {
      for (const actor of AUDIT_ACTORS) {
        const status = expectedAuditStatus(route.kind, actor, route.success);
        it(`${actor} → ${status}`, async () => {
          const w = world();
          const call = await route.prepare(w);
          const before = await storeFingerprint(w.t);
          const response = await call(w.as(actor));
          expect(response.status, JSON.stringify(response.body)).toBe(status);
          const after = await storeFingerprint(w.t);
          if (status >= 400) {
            expect(response.body.error.code).toBe({ 401: 'unauthenticated', 403: 'forbidden' }[status]);
            expect(after).toEqual(before);
          } else if (route.isWrite) {
            expect(after).not.toEqual(before);
          } else {
            expect(after).toEqual(before);
          }
        });
      }
    });
  }
}
