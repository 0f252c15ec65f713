import { Router } from 'express';
import { z } from 'zod';
import { userCreateSchema, userUpdateSchema } from '@tidemark/shared';
import { requireRole } from '../middleware/require-role';
import { parseOrThrow, validateBody } from '../middleware/validate';
import type { UserService } from '../services/user.service';

const idParams = z.object({ id: z.coerce.number().int().positive('Not a valid id.') });

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
    const { id } = parseOrThrow(idParams, req.params);
    res.json(await users.update(id, req.body, (req.user as Express.User).id));
  });

  return router;
}
