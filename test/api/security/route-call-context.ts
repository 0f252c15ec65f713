import { createHash } from 'node:crypto';
import { Secret } from 'otpauth';
import sharp from 'sharp';
import type { Response } from 'supertest';
import type { AuditView, CaseDetail, ComplicationView, CycleView, PhotoView, Role, StandardView } from '@tidemark/shared';
import { totpCode } from '../../../server/auth/totp';
import { FIXTURE_STANDARDS, addCycle, addStandard, auditBody, createAudit, defaultScheduleId, storeFingerprint } from '../support/audit-fixtures';
import { createCase, createClinicalWorld, daysAgo, expectStatus, visitBody, type ClinicalWorld } from '../support/clinical-fixtures';
import { ApiClient, cookieFrom, demoEmail } from '../support/test-app';
import type { ApiMethod } from '../support/route-inventory';
import type { Actor } from './route-access-table';

/*
 * What the route calls of route-calls.ts stand on: a context that makes real targets through
 * the API (as the audit lead) — fresh ones for every write, shared read-only ones built once —
 * plus sending a prepared call and fingerprinting the whole database.
 */

/** Whose case a case-scoped call targets: another clinician's, or the calling clinician's own. */
export type CaseOwner = 'other' | 'self';

/** One prepared request. */
export interface RouteCall {
  /** Path with real ids (and query string). */
  url: string;
  /** JSON body of a write. */
  body?: object;
  /** Multipart form (photos, imports): text fields plus one file in field `file`. */
  upload?: { fields: Record<string, string>; file: { bytes: Buffer; filename: string; contentType: string } };
  /** A client of its own (sign-in, sign-out), instead of the actor's shared one. */
  client?: ApiClient;
}

/** Shared, read-only targets: built once per world. */
export interface SharedTargets {
  /** A case per owner with a patient, one site, a 6-week visit, a complication and a photo. */
  cases: Record<CaseOwner, { caseId: number; patientId: number; siteId: number; photoId: number }>;
  /** An audit with one standard and two cycles (for compare). */
  audit: { id: number; firstCycleId: number; secondCycleId: number };
}

/** A team member made for one call (second-factor calls change the person they act on). */
export interface Member {
  client: ApiClient;
  id: number;
  email: string;
  password: string;
}

/** The demo account's user as services see it. */
function userOf(world: ClinicalWorld, role: Role): Express.User {
  return { id: world.ids[role], email: demoEmail(role), displayName: role, role };
}

/** Everything a route's `prepare` needs: the world, a counter for unique names, shared targets. */
export class RouteCallContext {
  private sequence = 0;
  private shared?: Promise<SharedTargets>;
  private png?: Promise<Buffer>;
  private readonly exportJobs = new Map<Role, Promise<string>>();
  private importJobId?: Promise<string>;

  constructor(readonly world: ClinicalWorld) {}

  get lead(): ApiClient {
    return this.world.as('audit_lead');
  }

  /** A number never used before in this world (unique e-mails, names, codes). */
  next(): number {
    this.sequence += 1;
    return this.sequence;
  }

  /** The operator of a case-scoped target. */
  ownerId(owner: CaseOwner): number {
    return owner === 'self' ? this.world.ids.clinician : this.world.ids.other;
  }

  /** A tiny valid PNG. */
  smallPng(): Promise<Buffer> {
    this.png ??= sharp({ create: { width: 8, height: 8, channels: 3, background: '#4a9' } }).png().toBuffer();
    return this.png;
  }

  targets(): Promise<SharedTargets> {
    this.shared ??= this.buildTargets();
    return this.shared;
  }

  private async buildTargets(): Promise<SharedTargets> {
    const cases = {} as SharedTargets['cases'];
    for (const owner of ['other', 'self'] as const) {
      const found = await this.caseWithVisit(owner);
      await this.addComplication(found.id);
      const photo = await this.addPhoto(found.id);
      cases[owner] = { caseId: found.id, patientId: found.patient.id, siteId: found.sites[0].id, photoId: photo.id };
    }
    const audit = await this.freshAudit();
    await addStandard(this.lead, audit.id, FIXTURE_STANDARDS[0]);
    const first = await addCycle(this.lead, audit.id, '2024-01-01', '2024-06-30');
    const second = await addCycle(this.lead, audit.id, '2024-07-01', '2024-12-31');
    return { cases, audit: { id: audit.id, firstCycleId: first.id, secondCycleId: second.id } };
  }

  /** A new member with `role`, made by the admin and signed in with a password on a client of their own. */
  async member(role: Role): Promise<Member> {
    const n = this.next();
    const email = `matrix.person.${n}@example.org`;
    const password = `matrix-person-passphrase-${n}`;
    // Straight through the service: the team API itself is checked by its own rows of the table.
    const created = await this.world.t.users.create({ email, displayName: `Matrix person ${n}`, role, password });
    const client = new ApiClient(this.world.t.app);
    expectStatus(await client.signIn(email, password), 200);
    return { client, id: created.id, email, password };
  }

  /** Starts setting up one-time codes on the member's own client; returns the secret an app would scan. */
  async startCodes(member: Member): Promise<Uint8Array> {
    const enrolment = expectStatus(await member.client.post('/api/auth/second-factor/enrolment'), 200);
    return Secret.fromBase32(enrolment.body.secret as string).bytes;
  }

  /** A member whose one-time codes are on (confirmed with the code of this 30-second step). */
  async memberWithCodes(role: Role): Promise<Member & { secret: Uint8Array }> {
    const member = await this.member(role);
    const secret = await this.startCodes(member);
    expectStatus(await member.client.post('/api/auth/second-factor/enrolment/confirm', { code: totpCode(secret, Date.now()) }), 200);
    return { ...member, secret };
  }

  /** A fresh operated case with one site, operated by the owner, registered by the audit lead. */
  freshCase(owner: CaseOwner): Promise<CaseDetail> {
    return createCase(this.lead, this.ownerId(owner));
  }

  /** A fresh case with its 6-week recall recorded. */
  async caseWithVisit(owner: CaseOwner): Promise<CaseDetail> {
    const found = await this.freshCase(owner);
    return expectStatus(await this.lead.post(`/api/cases/${found.id}/visits`, visitBody([{ siteId: found.sites[0].id, refGm: 9.5 }])), 201).body as CaseDetail;
  }

  async addComplication(caseId: number): Promise<ComplicationView> {
    return expectStatus(await this.lead.post(`/api/cases/${caseId}/complications`, complicationBody()), 201).body as ComplicationView;
  }

  async addPhoto(caseId: number): Promise<PhotoView> {
    const bytes = await this.smallPng();
    return expectStatus(await this.lead.upload(`/api/cases/${caseId}/photos`, { kind: 'recall' }, { bytes, filename: 'p.png', contentType: 'image/png' }), 201).body as PhotoView;
  }

  async freshAudit(): Promise<AuditView> {
    return createAudit(this.lead, auditBody(await defaultScheduleId(this.lead), { title: `Matrix audit ${this.next()}` }));
  }

  async freshCycle(): Promise<CycleView> {
    return addCycle(this.lead, (await this.freshAudit()).id, '2024-01-01', '2024-06-30');
  }

  async freshStandard(): Promise<StandardView> {
    return addStandard(this.lead, (await this.freshAudit()).id, FIXTURE_STANDARDS[0]);
  }

  /**
   * A finished governance workbook job of `actor` (of the lead for roles that may not export),
   * started once per starter: reading a job's progress or file does not use it up.
   */
  exportJob(actor: Actor): Promise<string> {
    const starter: Role = actor === 'partner' || actor === 'governance' ? actor : 'audit_lead';
    let job = this.exportJobs.get(starter);
    if (!job) {
      job = this.startExport(starter);
      this.exportJobs.set(starter, job);
    }
    return job;
  }

  private async startExport(starter: Role): Promise<string> {
    const audit = (await this.targets()).audit;
    const started = expectStatus(await this.world.as(starter).post(`/api/audits/${audit.id}/exports`, { cycleId: null }), 202);
    await this.world.t.exports.idle();
    return started.body.jobId as string;
  }

  /** A finished import job of the lead (the empty CSV template), started once. */
  importJob(): Promise<string> {
    this.importJobId ??= this.startImport();
    return this.importJobId;
  }

  private async startImport(): Promise<string> {
    const started = expectStatus(await this.lead.upload('/api/imports', {}, await this.importFile()), 202);
    await this.world.t.imports.idle();
    return started.body.jobId as string;
  }

  /** The CSV import template: a file the import accepts by kind. */
  async importFile(): Promise<{ bytes: Buffer; filename: string; contentType: string }> {
    const bytes = await this.world.t.imports.template(userOf(this.world, 'audit_lead'), 'csv');
    return { bytes, filename: 'import.csv', contentType: 'text/csv' };
  }
}

/** A valid grade I complication of a case operated 120 days ago. */
export function complicationBody() {
  return { type: 'delayed-healing', grade: 'I', onsetDate: daysAgo(110), resolutionDate: daysAgo(100), management: 'Review' };
}

/** Sends a prepared call; `withCsrf: false` leaves the X-XSRF-TOKEN header out (the cookie is still sent). */
export async function perform(client: ApiClient, method: ApiMethod, call: RouteCall, options: { withCsrf: boolean } = { withCsrf: true }): Promise<Response> {
  if (method === 'GET') return client.get(call.url);
  if (!client.xsrf) await client.get('/api/auth/me');
  const verb = ({ POST: 'post', PUT: 'put', PATCH: 'patch', DELETE: 'delete' } as const)[method];
  let pending = client.agent[verb](call.url);
  if (options.withCsrf) pending = pending.set('X-XSRF-TOKEN', client.xsrf);
  let response: Response;
  if (call.upload) {
    for (const [name, value] of Object.entries(call.upload.fields)) pending = pending.field(name, value);
    const { bytes, filename, contentType } = call.upload.file;
    response = await pending.attach('file', bytes, { filename, contentType });
  } else {
    response = await (call.body === undefined ? pending : pending.send(call.body));
  }
  // A refused write is answered with a fresh token cookie; keep echoing the current one.
  client.xsrf = cookieFrom(response, 'XSRF-TOKEN') ?? client.xsrf;
  return response;
}

/**
 * Everything the database holds that a request could change: storeFingerprint (row counts and
 * version sums of the clinical and audit tables) plus a digest of every other table's rows
 * (team, mail, second factor …), sessions excepted (every request renews its own).
 */
export async function databaseFingerprint(world: ClinicalWorld): Promise<Record<string, number | string>> {
  const fingerprint: Record<string, number | string> = { ...(await storeFingerprint(world.t)) };
  const covered = new Set(Object.keys(fingerprint).map((key) => key.split('.')[0]));
  for (const table of world.t.dataSource.entityMetadatas.map((metadata) => metadata.tableName).sort()) {
    if (table === 'session' || covered.has(table)) continue;
    const rows = (await world.t.dataSource.createQueryBuilder().select('*').from(table, 't').getRawMany()).map((row) => JSON.stringify(row)).sort();
    fingerprint[table] = createHash('sha256').update(rows.join('\n')).digest('hex');
  }
  return fingerprint;
}


/** A clinical world with its route-call context and shared targets built: what a sweep over every route starts from. */
export async function openRouteSweep(): Promise<{ world: ClinicalWorld; context: RouteCallContext }> {
  const world = await createClinicalWorld();
  const context = new RouteCallContext(world);
  await context.targets();
  return { world, context };
}

/** Waits for the background export and import jobs a sweep started, then closes its world. */
export async function closeRouteSweep(world: ClinicalWorld | undefined): Promise<void> {
  if (!world) return;
  await world.t.exports.idle();
  await world.t.imports.idle();
  await world.close();
}
