import { Router } from 'express';
import { userCreateSchema, userUpdateSchema } from '@tidemark/shared';
import { requireRole } from '../middleware/require-role';
import { validateBody } from '../middleware/validate';
import { routeId } from './route-params';
import type { UserService } from '../services/user.service';

/** `/api/users`: team administration, admin only. */
export function userRoutes(users: UserService): Router {
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

  return router;
}
