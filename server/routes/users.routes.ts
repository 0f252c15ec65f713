import { Router } from 'express';
import { userCreateSchema, userUpdateSchema, type UserUpdateRequest } from '@tidemark/shared';
import { logMemberAccessChanged, logMemberCreated, logPasswordSetByAdmin, logSecondFactorReset, logSessionsEnded } from '../logging/security-events';
import { requireRole } from '../middleware/require-role';
import { validateBody } from '../middleware/validate';
import { routeId } from './route-params';
import type { UserService } from '../services/user.service';
import type { OwnSessionsService } from '../services/own-sessions.service';
import type { SecondFactorService } from '../services/second-factor.service';
import { signedInUser } from './signed-in-user';

/** `/api/users`: team administration, admin only. */
export function userRoutes(users: UserService, secondFactors: SecondFactorService, ownSessions: OwnSessionsService): Router {
  const router = Router();
  router.use(requireRole('admin'));

  router.get('/', async (_req, res) => {
    res.json(await users.list());
  });

  router.post('/', validateBody(userCreateSchema), async (req, res) => {
    const created = await users.create(req.body);
    logMemberCreated(req, signedInUser(req).id, created.id, created.role);
    res.status(201).json(created);
  });

  router.patch('/:id', validateBody(userUpdateSchema), async (req, res) => {
    const id = routeId(req.params);
    const change: UserUpdateRequest = req.body;
    const updated = await users.update(id, change, (req.user as Express.User).id);
    if (change.password !== undefined) logPasswordSetByAdmin(req, signedInUser(req).id, id);
    if (change.role !== undefined || change.active !== undefined) logMemberAccessChanged(req, signedInUser(req).id, id, { role: change.role, active: change.active });
    res.json(updated);
  });

  // A lost phone: remove the member's one-time and recovery codes and end their sessions.
  router.delete('/:id/second-factor', async (req, res) => {
    await secondFactors.reset(routeId(req.params), signedInUser(req).id);
    logSecondFactorReset(req, signedInUser(req).id, routeId(req.params));
    res.status(204).end();
  });

  // A lost or shared device: end every session of the member (their codes and password stay).
  router.delete('/:id/sessions', async (req, res) => {
    const [accountId, userId] = [routeId(req.params), signedInUser(req).id];
    const ended = await ownSessions.endAllFor(accountId, userId);
    logSessionsEnded(req, userId, 'member', ended.endedSessions, accountId);
    res.json(ended);
  });

  return router;
}
