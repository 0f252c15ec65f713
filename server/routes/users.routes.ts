import { Router } from 'express';
import { userCreateSchema, userUpdateSchema } from '@tidemark/shared';
import { requireRole } from '../middleware/require-role';
import { validateBody } from '../middleware/validate';
import { routeId } from './route-params';
import type { UserService } from '../services/user.service';
import type { SecondFactorService } from '../services/second-factor.service';
import { signedInUser } from './signed-in-user';

/** `/api/users`: team administration, admin only. */
export function userRoutes(users: UserService, secondFactors: SecondFactorService): Router {
  const router = Router();
  router.use(requireRole('admin'));

  router.get('/', async (_req, res) => {
    res.json(await users.list());
  });

  router.post('/', validateBody(userCreateSchema), async (req, res) => {
    res.status(201).json(await users.create(req.body));
  });

  router.patch('/:id', validateBody(userUpdateSchema), async (req, res) => {
    res.json(await users.update(routeId(req.params), req.body, (req.user as Express.User).id));
  });

  // A lost phone: remove the member's one-time and recovery codes and end their sessions.
  router.delete('/:id/second-factor', async (req, res) => {
    await secondFactors.reset(routeId(req.params), signedInUser(req).id);
    res.status(204).end();
  });

  return router;
}
