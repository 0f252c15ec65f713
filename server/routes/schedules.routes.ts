import { Router } from 'express';
import { scheduleCreateSchema, scheduleUpdateSchema } from '@tidemark/shared';
import { requireAuth } from '../middleware/require-role';
import { validateBody } from '../middleware/validate';
import type { ScheduleService } from '../services/schedule.service';
import { routeId } from './route-params';

/** `/api/schedules`: recall schedules (audit lead writes; the clinical team and governance read). */
export function scheduleRoutes(schedules: ScheduleService): Router {
  const router = Router();
  router.use(requireAuth);
  router.get('/', async (req, res) => {
    res.json(await schedules.list(req.user as Express.User));
  });
  router.post('/', validateBody(scheduleCreateSchema), async (req, res) => {
    res.status(201).json(await schedules.create(req.user as Express.User, req.body));
  });
  router.patch('/:id', validateBody(scheduleUpdateSchema), async (req, res) => {
    res.json(await schedules.update(req.user as Express.User, routeId(req.params), req.body));
  });
  router.delete('/:id', async (req, res) => {
    await schedules.remove(req.user as Express.User, routeId(req.params));
    res.status(204).end();
  });
  return router;
}
