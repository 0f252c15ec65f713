import { totpCode } from '../../../server/auth/totp';
import { MailMessage } from '../../../server/entities/mail-message.entity';
import { FIXTURE_STANDARDS, auditBody, defaultScheduleId, scheduleBody } from '../support/audit-fixtures';
import { caseBody, daysAgo, expectStatus, patientBody, siteBody, visitBody } from '../support/clinical-fixtures';
import { ApiClient, demoEmail, signedInAs } from '../support/test-app';
import type { Actor } from './route-access-table';
import { complicationBody, type CaseOwner, type RouteCall, type RouteCallContext } from './route-call-context';

/*
 * How to call every API route with valid parameters, for any actor: real ids, fresh targets for
 * every write, shared read-only targets built once (route-call-context.ts). Read by the access
 * matrix and the CSRF sweep; keys match route-access-table.ts.
 */

type Prepare = (context: RouteCallContext, actor: Actor, owner: CaseOwner) => Promise<RouteCall>;

/** A client of its own for the actor (signed in afresh unless anonymous). */
async function ownClient(context: RouteCallContext, actor: Actor): Promise<ApiClient> {
  return actor === 'anonymous' ? new ApiClient(context.world.t.app) : signedInAs(context.world.t.app, actor);
}

/** A code the server has not seen used: the next 30-second step, inside its ±1-step window (RFC 6238 §5.2). */
function nextCode(secret: Uint8Array): string {
  return totpCode(secret, Date.now() + 30_000);
}

/** Every route's call. Keys match ROUTE_ACCESS. */
export const ROUTE_CALLS: Readonly<Record<string, Prepare>> = {
  'GET /api/health': async () => ({ url: '/api/health' }),

  'POST /api/auth/login': async (context, actor) => ({
    url: '/api/auth/login',
    body: { email: demoEmail(actor === 'anonymous' ? 'partner' : actor), password: 'tidemark-demo' },
    client: await ownClient(context, actor),
  }),
  'GET /api/auth/me': async () => ({ url: '/api/auth/me' }),
  'POST /api/auth/logout': async (context, actor) => ({ url: '/api/auth/logout', client: await ownClient(context, actor) }),
  'GET /api/auth/sign-in-options': async () => ({ url: '/api/auth/sign-in-options' }),
  'POST /api/auth/password': async (context, actor) => {
    // A member of their own: changing a demo account's password would lock the other calls out.
    if (actor === 'anonymous') return { url: '/api/auth/password', body: { currentPassword: 'anything-at-all', newPassword: 'matrix-new-passphrase-0' }, client: new ApiClient(context.world.t.app) };
    const member = await context.member(actor);
    return { url: '/api/auth/password', body: { currentPassword: member.password, newPassword: `matrix-new-passphrase-${context.next()}` }, client: member.client };
  },
  'GET /api/auth/sessions': async () => ({ url: '/api/auth/sessions' }),
  'POST /api/auth/sessions/end-others': async (context, actor) => {
    // A member of their own, so that no shared client of the matrix is signed out.
    if (actor === 'anonymous') return { url: '/api/auth/sessions/end-others', client: new ApiClient(context.world.t.app) };
    return { url: '/api/auth/sessions/end-others', client: (await context.member(actor)).client };
  },
  'DELETE /api/auth/sessions/:id': async (context, actor) => {
    if (actor === 'anonymous') return { url: '/api/auth/sessions/AAAAAAAAAAAAAAAAAAAAAA', client: new ApiClient(context.world.t.app) };
    // A member with a second session, which the first one ends.
    const member = await context.member(actor);
    expectStatus(await new ApiClient(context.world.t.app).signIn(member.email, member.password), 200);
    const listed = expectStatus(await member.client.get('/api/auth/sessions'), 200).body as Array<{ id: string; isCurrent: boolean }>;
    const other = listed.find((session) => !session.isCurrent);
    if (!other) throw new Error('The member has no second session to end.');
    return { url: `/api/auth/sessions/${other.id}`, client: member.client };
  },
  'GET /api/auth/second-factor': async () => ({ url: '/api/auth/second-factor' }),
  'POST /api/auth/second-factor/enrolment': async (context, actor) => ({
    url: '/api/auth/second-factor/enrolment',
    client: actor === 'anonymous' ? new ApiClient(context.world.t.app) : (await context.member(actor)).client,
  }),
  'POST /api/auth/second-factor/enrolment/confirm': async (context, actor) => {
    if (actor === 'anonymous') return { url: '/api/auth/second-factor/enrolment/confirm', body: { code: '123456' }, client: new ApiClient(context.world.t.app) };
    const member = await context.member(actor);
    const secret = await context.startCodes(member);
    return { url: '/api/auth/second-factor/enrolment/confirm', body: { code: totpCode(secret, Date.now()) }, client: member.client };
  },
  'POST /api/auth/second-factor/verify': async (context, actor) => {
    if (actor === 'anonymous') return { url: '/api/auth/second-factor/verify', body: { method: 'one-time-code', code: '123456' }, client: new ApiClient(context.world.t.app) };
    const member = await context.memberWithCodes(actor);
    // A new sign-in with the password only: the session waits for its code.
    const waiting = new ApiClient(context.world.t.app);
    expectStatus(await waiting.signIn(member.email, member.password), 200);
    return { url: '/api/auth/second-factor/verify', body: { method: 'one-time-code', code: nextCode(member.secret) }, client: waiting };
  },
  'POST /api/auth/second-factor/recovery-codes': async (context, actor) => {
    if (actor === 'anonymous') return { url: '/api/auth/second-factor/recovery-codes', body: { code: '123456' }, client: new ApiClient(context.world.t.app) };
    const member = await context.memberWithCodes(actor);
    return { url: '/api/auth/second-factor/recovery-codes', body: { code: nextCode(member.secret) }, client: member.client };
  },
  'POST /api/auth/second-factor/disable': async (context, actor) => {
    if (actor === 'anonymous') return { url: '/api/auth/second-factor/disable', body: { code: '123456' }, client: new ApiClient(context.world.t.app) };
    const member = await context.memberWithCodes(actor);
    return { url: '/api/auth/second-factor/disable', body: { code: nextCode(member.secret) }, client: member.client };
  },

  'GET /api/users': async () => ({ url: '/api/users' }),
  'POST /api/users': async (context) => {
    const n = context.next();
    return { url: '/api/users', body: { email: `matrix.member.${n}@example.org`, displayName: `Matrix member ${n}`, role: 'partner', password: `matrix-member-passphrase-${n}` } };
  },
  'PATCH /api/users/:id': async (context) => {
    const n = context.next();
    const created = expectStatus(
      await context.world.as('admin').post('/api/users', { email: `matrix.target.${n}@example.org`, displayName: `Matrix target ${n}`, role: 'partner', password: `matrix-target-passphrase-${n}` }),
      201,
    );
    return { url: `/api/users/${created.body.id}`, body: { displayName: `Renamed member ${n}` } };
  },
  'DELETE /api/users/:id/second-factor': async (context) => ({ url: `/api/users/${(await context.memberWithCodes('clinician')).id}/second-factor` }),
  'DELETE /api/users/:id/sessions': async (context) => ({ url: `/api/users/${(await context.member('clinician')).id}/sessions` }),
  'GET /api/operators': async () => ({ url: '/api/operators' }),

  'GET /api/patients': async () => ({ url: '/api/patients' }),
  'POST /api/patients': async () => ({ url: '/api/patients', body: patientBody() }),
  'GET /api/patients/:id': async (context, _actor, owner) => ({ url: `/api/patients/${(await context.targets()).cases[owner].patientId}` }),
  'PATCH /api/patients/:id': async (context, _actor, owner) => {
    const found = await context.freshCase(owner);
    return { url: `/api/patients/${found.patient.id}`, body: { birthYear: 1981, version: found.patient.version, reason: 'Corrected birth year' } };
  },

  'GET /api/cases': async () => ({ url: '/api/cases' }),
  'POST /api/cases': async (context, actor) => ({ url: '/api/cases', body: caseBody(actor === 'clinician' ? context.world.ids.clinician : context.world.ids.other) }),
  'GET /api/cases/:id': async (context, _actor, owner) => ({ url: `/api/cases/${(await context.targets()).cases[owner].caseId}` }),
  'PATCH /api/cases/:id': async (context, _actor, owner) => {
    const found = await context.freshCase(owner);
    return { url: `/api/cases/${found.id}`, body: { notes: 'Checked in the access matrix', version: found.version, reason: 'Access matrix edit' } };
  },
  'POST /api/cases/:id/sites': async (context, _actor, owner) => ({ url: `/api/cases/${(await context.freshCase(owner)).id}/sites`, body: siteBody({ tooth: 21 }) }),
  'POST /api/cases/:id/visits': async (context, _actor, owner) => {
    const found = await context.freshCase(owner);
    return { url: `/api/cases/${found.id}/visits`, body: visitBody([{ siteId: found.sites[0].id, refGm: 9.5 }]) };
  },
  'POST /api/cases/:id/complications': async (context, _actor, owner) => ({ url: `/api/cases/${(await context.freshCase(owner)).id}/complications`, body: complicationBody() }),
  'POST /api/cases/:id/photos': async (context, _actor, owner) => ({
    url: `/api/cases/${(await context.freshCase(owner)).id}/photos`,
    upload: { fields: { kind: 'recall' }, file: { bytes: await context.smallPng(), filename: 'p.png', contentType: 'image/png' } },
  }),
  'PATCH /api/sites/:id': async (context, _actor, owner) => {
    const site = (await context.freshCase(owner)).sites[0];
    return { url: `/api/sites/${site.id}`, body: { ktWidth: 4.5, version: site.version, reason: 'Re-measured the band' } };
  },
  'PATCH /api/visits/:id': async (context, _actor, owner) => {
    const visit = (await context.caseWithVisit(owner)).visits[0];
    return { url: `/api/visits/${visit.id}`, body: { pain: 2, version: visit.version, reason: 'Patient corrected the score' } };
  },
  'PATCH /api/complications/:id': async (context, _actor, owner) => {
    const complication = await context.addComplication((await context.freshCase(owner)).id);
    return { url: `/api/complications/${complication.id}`, body: { grade: 'II', version: complication.version, reason: 'Antibiotics were needed' } };
  },
  'GET /api/photos/:id': async (context, _actor, owner) => ({ url: `/api/photos/${(await context.targets()).cases[owner].photoId}` }),
  'GET /api/photos/:id/thumbnail': async (context, _actor, owner) => ({ url: `/api/photos/${(await context.targets()).cases[owner].photoId}/thumbnail` }),
  'POST /api/calibration-readings': async (context, _actor, owner) => ({
    url: '/api/calibration-readings',
    body: { siteId: (await context.targets()).cases[owner].siteId, measuredOn: daysAgo(1), refGm: 9 },
  }),

  'GET /api/recalls/due': async () => ({ url: '/api/recalls/due' }),
  'GET /api/history': async () => ({ url: '/api/history' }),

  'GET /api/schedules': async () => ({ url: '/api/schedules' }),
  'POST /api/schedules': async (context) => ({ url: '/api/schedules', body: scheduleBody({ name: `Matrix schedule ${context.next()}` }) }),
  'PATCH /api/schedules/:id': async (context) => {
    const created = expectStatus(await context.lead.post('/api/schedules', scheduleBody({ name: `Matrix schedule ${context.next()}` })), 201);
    return { url: `/api/schedules/${created.body.id}`, body: { name: `Renamed schedule ${context.next()}`, version: created.body.version } };
  },
  'DELETE /api/schedules/:id': async (context) => {
    const created = expectStatus(await context.lead.post('/api/schedules', scheduleBody({ name: `Matrix schedule ${context.next()}` })), 201);
    return { url: `/api/schedules/${created.body.id}` };
  },

  'GET /api/audits': async () => ({ url: '/api/audits' }),
  'POST /api/audits': async (context) => ({ url: '/api/audits', body: auditBody(await defaultScheduleId(context.lead), { title: `Matrix audit ${context.next()}` }) }),
  'POST /api/audits/cohort-preview': async () => ({ url: '/api/audits/cohort-preview', body: { cohort: {} } }),
  'GET /api/audits/:id': async (context) => ({ url: `/api/audits/${(await context.targets()).audit.id}` }),
  'PATCH /api/audits/:id': async (context) => {
    const audit = await context.freshAudit();
    return { url: `/api/audits/${audit.id}`, body: { title: `Renamed audit ${context.next()}`, version: audit.version } };
  },
  'DELETE /api/audits/:id': async (context) => ({ url: `/api/audits/${(await context.freshAudit()).id}` }),
  'POST /api/audits/:id/standards': async (context) => ({ url: `/api/audits/${(await context.freshAudit()).id}/standards`, body: FIXTURE_STANDARDS[0] }),
  'POST /api/audits/:id/cycles': async (context) => ({ url: `/api/audits/${(await context.freshAudit()).id}/cycles`, body: { periodStart: '2024-01-01', periodEnd: '2024-06-30' } }),
  'GET /api/audits/:id/notes': async (context) => ({ url: `/api/audits/${(await context.targets()).audit.id}/notes` }),
  'POST /api/audits/:id/notes': async (context) => ({ url: `/api/audits/${(await context.freshAudit()).id}/notes`, body: { topic: 'chart:funnel', text: 'Worth a look at the next meeting.' } }),
  'GET /api/audits/:id/results': async (context) => ({ url: `/api/audits/${(await context.targets()).audit.id}/results?groupBy=operator` }),
  'GET /api/audits/:id/funnel': async (context) => ({ url: `/api/audits/${(await context.targets()).audit.id}/funnel` }),
  'GET /api/audits/:id/trend': async (context) => ({ url: `/api/audits/${(await context.targets()).audit.id}/trend` }),
  'GET /api/audits/:id/survival': async (context) => ({ url: `/api/audits/${(await context.targets()).audit.id}/survival` }),
  'GET /api/audits/:id/calibration': async (context) => ({ url: `/api/audits/${(await context.targets()).audit.id}/calibration` }),
  'GET /api/audits/:id/compare': async (context) => {
    const { audit } = await context.targets();
    return { url: `/api/audits/${audit.id}/compare?first=${audit.firstCycleId}&second=${audit.secondCycleId}` };
  },
  'POST /api/audits/:id/send-pack': async (context) => ({ url: `/api/audits/${(await context.targets()).audit.id}/send-pack`, body: { cycleId: null } }),
  'POST /api/audits/:id/exports': async (context) => ({ url: `/api/audits/${(await context.targets()).audit.id}/exports`, body: { cycleId: null } }),

  'PATCH /api/standards/:id': async (context) => {
    const standard = await context.freshStandard();
    return { url: `/api/standards/${standard.id}`, body: { ...FIXTURE_STANDARDS[0], target: 1.5, version: standard.version } };
  },
  'DELETE /api/standards/:id': async (context) => ({ url: `/api/standards/${(await context.freshStandard()).id}` }),
  'PATCH /api/cycles/:id': async (context) => {
    const cycle = await context.freshCycle();
    return { url: `/api/cycles/${cycle.id}`, body: { notes: 'Scope agreed at the meeting', version: cycle.version } };
  },
  'DELETE /api/cycles/:id': async (context) => ({ url: `/api/cycles/${(await context.freshCycle()).id}` }),
  'POST /api/cycles/:id/actions': async (context) => ({
    url: `/api/cycles/${(await context.freshCycle()).id}/actions`,
    body: { action: 'Re-train on the stent notch', ownerId: context.world.ids.audit_lead, dueDate: '2030-01-31' },
  }),
  'PATCH /api/actions/:id': async (context) => {
    const action = await freshAction(context);
    return { url: `/api/actions/${action.id}`, body: { state: 'under-way', version: action.version } };
  },
  'DELETE /api/actions/:id': async (context) => ({ url: `/api/actions/${(await freshAction(context)).id}` }),

  'GET /api/exports/:jobId': async (context, actor) => ({ url: `/api/exports/${await context.exportJob(actor)}` }),
  'GET /api/exports/:jobId/file': async (context, actor) => ({ url: `/api/exports/${await context.exportJob(actor)}/file` }),

  'GET /api/imports/template.xlsx': async () => ({ url: '/api/imports/template.xlsx' }),
  'GET /api/imports/template.csv': async () => ({ url: '/api/imports/template.csv' }),
  'POST /api/imports': async (context) => ({ url: '/api/imports', upload: { fields: {}, file: await context.importFile() } }),
  'GET /api/imports/:jobId': async (context) => ({ url: `/api/imports/${await context.importJob()}` }),
  'GET /api/imports/:jobId/errors.csv': async (context) => ({ url: `/api/imports/${await context.importJob()}/errors.csv` }),

  'GET /api/outbox': async () => ({ url: '/api/outbox' }),
  'POST /api/outbox/run': async () => ({ url: '/api/outbox/run' }),
  'POST /api/outbox/:id/retry': async (context) => {
    const repository = context.world.t.dataSource.getRepository(MailMessage);
    const failed = await repository.save(
      repository.create({ kind: 'governance-pack', toAddress: 'governance@example.org', subject: 'Matrix message', body: 'Matrix', status: 'failed', attempts: 5, lastError: 'refused', nextAttemptAt: null, sentAt: null, messageId: null, dedupeKey: null }),
    );
    return { url: `/api/outbox/${failed.id}/retry` };
  },

  'GET /api/settings/system': async () => ({ url: '/api/settings/system' }),
  // Each allowed call writes one more backup file into the world's data folder; nothing in the database changes.
  'POST /api/settings/backups': async () => ({ url: '/api/settings/backups' }),
};

async function freshAction(context: RouteCallContext) {
  const cycle = await context.freshCycle();
  return expectStatus(await context.lead.post(`/api/cycles/${cycle.id}/actions`, { action: 'Re-train on the stent notch', ownerId: context.world.ids.audit_lead, dueDate: '2030-01-31' }), 201).body as {
    id: number;
    version: number;
  };
}

