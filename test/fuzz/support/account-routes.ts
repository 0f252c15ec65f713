import fc from 'fast-check';
import { loginSchema, oneTimeCodeRequestSchema, passwordChangeSchema, secondFactorVerifySchema, userCreateSchema, userUpdateSchema } from '@tidemark/shared';
import { DEMO_PASSWORD } from '../../../server/demo/demo-accounts';
import { demoEmail } from '../../api/support/test-app';
import { nastyString } from '../generators';
import { hostileText, sixDigits, type FuzzRoute, type JsonRoute } from './fuzz-route';

/** Sign-in, sign-out, one-time codes and team administration. */
export const ACCOUNT_ROUTES: readonly FuzzRoute[] = [
  {
    method: 'POST',
    path: '/api/auth/login',
    group: 'auth',
    body: 'json',
    schema: loginSchema,
    actor: 'anonymous',
    refusedActors: [],
    validBody: () => ({ email: demoEmail('admin'), password: DEMO_PASSWORD }),
    refused: () =>
      fc.record({
        email: fc.constantFrom(demoEmail('admin'), demoEmail('clinician'), 'nobody@example.org', "o'brien@example.org"),
        password: fc.oneof(nastyString, fc.string({ minLength: 1, maxLength: 256 })).filter((password) => password.length >= 1 && password.length <= 256 && password !== DEMO_PASSWORD),
      }).map((body) => ({ body })),
  },
  {
    method: 'POST',
    path: '/api/auth/logout',
    group: 'auth',
    body: 'none',
    actor: 'anonymous',
    refusedActors: [],
    needsFreshSession: true,
    acceptsIgnoredBody: 'Signing out takes no input and is always allowed, so a well-formed request with any body is a 204.',
  },
  {
    method: 'POST',
    path: '/api/auth/password',
    group: 'auth',
    body: 'json',
    schema: passwordChangeSchema,
    actor: 'admin',
    refusedActors: ['anonymous'],
    validBody: () => ({ currentPassword: DEMO_PASSWORD, newPassword: 'fuzz-new-passphrase-71' }),
    // A well-formed change with a wrong current password: 400, then 429 once the member's limit is reached; never a change.
    refused: () =>
      fc.record({
        currentPassword: fc.oneof(nastyString, fc.string({ minLength: 1, maxLength: 256 })).filter((password) => password.length >= 1 && password.length <= 256 && password !== DEMO_PASSWORD),
        newPassword: fc.constant('fuzz-new-passphrase-71'),
      }).map((body) => ({ body })),
  },
  {
    // Ends the member's other sessions: no input, so only the parser, the actor and the CSRF token can make it invalid.
    method: 'POST',
    path: '/api/auth/sessions/end-others',
    group: 'auth',
    body: 'none',
    actor: 'admin',
    refusedActors: ['anonymous'],
  },
  {
    // Handles are 22 base64url characters; the path's own ":id" is not one (400), and nothing here names a live session.
    method: 'DELETE',
    path: '/api/auth/sessions/:id',
    group: 'auth',
    body: 'none',
    actor: 'admin',
    refusedActors: ['anonymous'],
  },
  {
    method: 'POST',
    path: '/api/auth/second-factor/verify',
    group: 'auth',
    body: 'json',
    schema: secondFactorVerifySchema,
    actor: 'admin',
    refusedActors: ['anonymous'],
    validBody: () => ({ method: 'one-time-code', code: '123456' }),
    // The session is fully signed in, not waiting for a code: 409 whatever the code.
    refused: () => fc.oneof(sixDigits.map((code) => ({ body: { method: 'one-time-code', code } })), fc.constant({ body: { method: 'recovery-code', code: 'ABCD-EFGH-JKMN-PQRS-TVWX-YZ01-2345' } })),
  },
  {
    method: 'POST',
    path: '/api/auth/second-factor/enrolment',
    group: 'auth',
    body: 'none',
    actor: 'admin',
    refusedActors: ['anonymous'],
  },
  ...(['enrolment/confirm', 'recovery-codes', 'disable'] as const).map(
    (step): JsonRoute => ({
      method: 'POST',
      path: `/api/auth/second-factor/${step}`,
      group: 'auth',
      body: 'json',
      schema: oneTimeCodeRequestSchema,
      actor: 'admin',
      refusedActors: ['anonymous'],
      validBody: () => ({ code: '123456' }),
      // No set-up was started and codes are off for the fuzzing admin: every code is refused.
      refused: () => sixDigits.map((code) => ({ body: { code } })),
    }),
  ),
  {
    method: 'POST',
    path: '/api/users',
    group: 'team',
    body: 'json',
    schema: userCreateSchema,
    actor: 'admin',
    refusedActors: ['anonymous', 'clinician', 'audit_lead'],
    validBody: () => ({ email: 'fuzz.newcomer@example.org', displayName: 'Fuzz Newcomer', role: 'clinician', password: 'a-long-enough-passphrase-91' }),
    refused: () =>
      fc.record({ email: fc.constantFrom(demoEmail('clinician'), demoEmail('admin').toUpperCase()), displayName: hostileText(120), password: fc.constant('another-long-passphrase-42') }).map((body) => ({ body: { ...body, role: 'partner' } })),
  },
  {
    method: 'PATCH',
    path: '/api/users/:id',
    group: 'team',
    body: 'json',
    schema: userUpdateSchema,
    actor: 'admin',
    refusedActors: ['anonymous', 'clinician', 'partner'],
    existingId: (ids) => ids.users.other,
    validBody: () => ({ displayName: 'Dr Sam Second (renamed)' }),
    // The administrator deactivating their own account: 409.
    refused: (ids) => hostileText(120).map((displayName) => ({ id: ids.users.admin, body: { active: false, displayName } })),
  },
  {
    method: 'DELETE',
    path: '/api/users/:id/sessions',
    group: 'team',
    body: 'none',
    actor: 'admin',
    refusedActors: ['anonymous', 'clinician', 'audit_lead'],
    existingId: (ids) => ids.users.other,
    // Ending one's own sessions here is refused: 409.
    refused: (ids) => fc.constant({ id: ids.users.admin }),
  },
  {
    method: 'DELETE',
    path: '/api/users/:id/second-factor',
    group: 'team',
    body: 'none',
    actor: 'admin',
    refusedActors: ['anonymous', 'clinician', 'audit_lead'],
    existingId: (ids) => ids.users.other,
    // Resetting one's own codes here is refused: 409.
    refused: (ids) => fc.constant({ id: ids.users.admin }),
  },
  {
    // Takes a backup of the SQLite file (server/routes/settings.routes.ts): no input, so only the
    // parser, the actor and the CSRF token can make it invalid; none of those cases may write a file.
    method: 'POST',
    path: '/api/settings/backups',
    group: 'team',
    body: 'none',
    actor: 'admin',
    refusedActors: ['anonymous', 'audit_lead', 'clinician', 'partner', 'governance'],
  },
];
