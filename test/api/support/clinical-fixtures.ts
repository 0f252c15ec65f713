import type { Response } from 'supertest';
import type { CaseCreateRequest, CaseDetail, PatientCreateRequest, Role, SiteFieldsInput, SiteMeasurementInput, VisitCreateRequest } from '@tidemark/shared';
import { ApiClient, createTestApp, signedInAs, type TestApp } from './test-app';
import { queryRows } from './test-database';

/*
 * Builders for valid clinical bodies and a small "world" of signed-in clients, shared by the
 * clinical-records API specs. Every builder returns a body the API accepts as it is; tests
 * override one field at a time to make it invalid.
 */

const DAY_MS = 86_400_000;

/** Today's date in UTC (the server's notion of "not in the future"). */
export function todayUtc(): string {
  return new Date().toISOString().slice(0, 10);
}

/** The UTC date `days` days before today (negative: after today). */
export function daysAgo(days: number): string {
  return new Date(Date.now() - days * DAY_MS).toISOString().slice(0, 10);
}

let codeSequence = 0;

/** A fresh pseudonymous patient code (3–20 letters, digits, hyphens). */
export function nextPatientCode(prefix = 'TM'): string {
  codeSequence += 1;
  return `${prefix}-${String(codeSequence).padStart(4, '0')}`;
}

/** A valid `POST /api/patients` body: a never-smoker with a thin phenotype. */
export function patientBody(overrides: Partial<PatientCreateRequest> = {}): PatientCreateRequest {
  return {
    code: nextPatientCode(),
    birthYear: 1980,
    sex: 'female',
    smoking: 'never',
    cigarettesPerDay: null,
    diabetes: 'none',
    phenotype: 'thin',
    phenotypeMethod: 'probe-visibility',
    ...overrides,
  };
}

/**
 * A valid site: baseline REF→GM 8 mm, post-op 10 mm (crown gain 2 mm). KT 5 − excision 1.5 = 3.5 mm
 * and margin-to-crest 5 − 1.5 = 3.5 mm, so no planning warning by default.
 */
export function siteBody(overrides: Partial<SiteFieldsInput> = {}): SiteFieldsInput {
  return {
    tooth: 11,
    location: 'mid-facial',
    referencePoint: 'incisal-edge',
    baselineRefGm: 8,
    probingDepth: 2,
    ktWidth: 5,
    marginToCrest: 5,
    papillaScore: null,
    plannedExcision: 1.5,
    postOpRefGm: 10,
    ...overrides,
  };
}

/** A valid `POST /api/cases` body with a new patient: operated 120 days ago, one site on tooth 11. */
export function caseBody(operatorId: number, overrides: Partial<CaseCreateRequest> = {}): CaseCreateRequest {
  return {
    patient: patientBody(),
    operatorId,
    surgeryDate: daysAgo(120),
    procedure: 'gingivectomy',
    indication: 'aesthetic',
    instrument: 'scalpel',
    hygienePhaseComplete: true,
    bleedingScorePct: 10,
    plaqueScorePct: 15,
    status: 'operated',
    sites: [siteBody()],
    ...overrides,
  };
}

/** A valid recall body: the 6-week recall, 78 days ago (42 days after a surgery 120 days ago). */
export function visitBody(measurements: SiteMeasurementInput[], overrides: Partial<VisitCreateRequest> = {}): VisitCreateRequest {
  return { intervalKey: '6w', visitDate: daysAgo(78), pain: 1, satisfaction: 9, notes: '', measurements, ...overrides };
}

/** Who makes a request in an access test. */
export type Actor = 'anonymous' | Role | 'other';

/** An app with every demo role signed in, plus a second clinician ("other") made through the admin API. */
export interface ClinicalWorld {
  t: TestApp;
  ids: Record<Role | 'other', number>;
  as(actor: Actor): ApiClient;
  close(): Promise<void>;
}

const SECOND_CLINICIAN = { email: 'second.operator@example.org', displayName: 'Dr Sam Second (test)', role: 'clinician', password: 'second-operator-long-passphrase' } as const;

/** Builds the world: a fresh database, one client per role and a second clinician. */
export async function createClinicalWorld(options: Parameters<typeof createTestApp>[0] = {}): Promise<ClinicalWorld> {
  const t = await createTestApp(options);
  const roles: Role[] = ['admin', 'audit_lead', 'clinician', 'partner', 'governance'];
  const clients = new Map<Actor, ApiClient>();
  for (const role of roles) clients.set(role, await signedInAs(t.app, role));
  const admin = clients.get('admin') as ApiClient;
  const created = await admin.post('/api/users', SECOND_CLINICIAN);
  if (created.status !== 201) throw new Error(`Could not create the second clinician: ${created.status} ${JSON.stringify(created.body)}`);
  const other = new ApiClient(t.app);
  const signIn = await other.signIn(SECOND_CLINICIAN.email, SECOND_CLINICIAN.password);
  if (signIn.status !== 200) throw new Error('The second clinician could not sign in.');
  clients.set('other', other);
  const ids = {} as Record<Role | 'other', number>;
  for (const actor of [...roles, 'other'] as const) {
    ids[actor] = (await (clients.get(actor) as ApiClient).get('/api/auth/me')).body.user.id as number;
  }
  return {
    t,
    ids,
    as: (actor) => (actor === 'anonymous' ? new ApiClient(t.app) : (clients.get(actor) as ApiClient)),
    close: () => t.close(),
  };
}

/** Throws with the answer when a set-up call did not give the expected status. */
export function expectStatus(response: Response, status: number): Response {
  if (response.status !== status) throw new Error(`Expected ${status}, got ${response.status}: ${JSON.stringify(response.body)}`);
  return response;
}

/** Registers a case through the API (as `client`) and returns its detail. */
export async function createCase(client: ApiClient, operatorId: number, overrides: Partial<CaseCreateRequest> = {}): Promise<CaseDetail> {
  return expectStatus(await client.post('/api/cases', caseBody(operatorId, overrides)), 201).body as CaseDetail;
}

/** Tables of the clinical record. */
export const CLINICAL_TABLES = ['patient', 'surgical_case', 'site', 'visit', 'site_measurement', 'complication', 'photo', 'change_record'] as const;
export type ClinicalTable = (typeof CLINICAL_TABLES)[number];
const VERSIONED: ReadonlySet<ClinicalTable> = new Set<ClinicalTable>(['patient', 'surgical_case', 'site', 'visit', 'complication']);

/** `SELECT COUNT(*)` of one table. */
export async function countRows(t: TestApp, table: ClinicalTable): Promise<number> {
  const [row] = (await t.dataSource.query(`SELECT COUNT(*) AS n FROM ${table}`)) as { n: number }[];
  return Number(row.n);
}

/** Row counts of every clinical table and the sum of versions of the versioned ones: any write changes it. */
export async function clinicalFingerprint(t: TestApp): Promise<Record<string, number>> {
  const fingerprint: Record<string, number> = {};
  for (const table of CLINICAL_TABLES) {
    fingerprint[table] = await countRows(t, table);
    if (VERSIONED.has(table)) {
      const [row] = (await t.dataSource.query(`SELECT COALESCE(SUM(version), 0) AS v FROM ${table}`)) as { v: number }[];
      fingerprint[`${table}.versions`] = Number(row.v);
    }
  }
  return fingerprint;
}

/** The stored version of one row. */
export async function versionOf(t: TestApp, table: ClinicalTable, id: number): Promise<number> {
  const [row] = await queryRows<{ version: number }>(t.dataSource, `SELECT version FROM ${table} WHERE id = :id`, { id });
  if (!row) throw new Error(`No ${table} row ${id}`);
  return Number(row.version);
}

/** One stored row, as the database has it. */
export async function rowOf(t: TestApp, table: ClinicalTable, id: number): Promise<Record<string, unknown>> {
  const [row] = await queryRows(t.dataSource, `SELECT * FROM ${table} WHERE id = :id`, { id });
  if (!row) throw new Error(`No ${table} row ${id}`);
  return row;
}

/** Kinds of route for the access matrix (DESIGN.md §2). */
export type AccessKind = 'list' | 'create' | 'read' | 'write';

/** A route under test: `prepare` builds a fresh target whose case is operated by `ownerId` and returns the call. */
export interface AccessRoute {
  name: string;
  kind: AccessKind;
  success: number;
  prepare(world: ClinicalWorld, ownerId: number): Promise<(client: ApiClient) => Promise<Response>>;
}

/** The actors of the matrix; "clinician-own" is the clinician on a case they operate. */
export const MATRIX_ACTORS = ['anonymous', 'governance', 'admin', 'partner', 'audit_lead', 'clinician-own', 'clinician-others'] as const;
export type MatrixActor = (typeof MATRIX_ACTORS)[number];

/**
 * Expected status (DESIGN.md §2 roles table): anonymous 401; governance 403 on every patient-level
 * route; admin and partner read but do not write; the audit lead reads and writes everything; a
 * clinician reads and writes their own cases, and another operator's case answers 404.
 */
export function expectedStatus(kind: AccessKind, actor: MatrixActor, success: number): number {
  if (actor === 'anonymous') return 401;
  if (actor === 'governance') return 403;
  if (actor === 'admin' || actor === 'partner') return kind === 'list' || kind === 'read' ? success : 403;
  if (actor === 'clinician-others') return kind === 'list' || kind === 'create' ? success : 404;
  return success;
}

/** Defines one test per actor for each route; denied calls must leave the database as it was. */
export function describeAccessMatrix(world: () => ClinicalWorld, routes: AccessRoute[]): void {
  for (const route of routes) {
    describe(route.name, () => {
      // Lists and creations have no "another operator's case": the clinician acts for themselves.
      const actors = route.kind === 'list' || route.kind === 'create' ? MATRIX_ACTORS.filter((actor) => actor !== 'clinician-others') : MATRIX_ACTORS;
      for (const actor of actors) {
        const status = expectedStatus(route.kind, actor, route.success);
        it(`${actor} → ${status}`, async () => {
          const w = world();
          const ownerId = actor === 'clinician-own' ? w.ids.clinician : w.ids.other;
          const call = await route.prepare(w, ownerId);
          const client = w.as(actor === 'clinician-own' || actor === 'clinician-others' ? 'clinician' : actor);
          const before = await clinicalFingerprint(w.t);
          const response = await call(client);
          expect(response.status, JSON.stringify(response.body)).toBe(status);
          if (status >= 400) {
            expect(response.body.error.code).toBe({ 401: 'unauthenticated', 403: 'forbidden', 404: 'not_found' }[status]);
            expect(await clinicalFingerprint(w.t)).toEqual(before);
          } else if (route.kind === 'create' || route.kind === 'write') {
            expect(await clinicalFingerprint(w.t)).not.toEqual(before);
          }
        });
      }
    });
  }
}
