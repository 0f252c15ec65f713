import { Router } from 'express';
import * as z from 'zod';
import { requireRole } from '../middleware/require-role';
import { validateBody } from '../middleware/validate';
import type { MailService } from '../services/mail.service';
import { routeId } from './route-params';

/** `POST /api/audits/:id/send-pack` body: live results (no cycle) or one cycle. */
export const sendPackSchema = z.object({ cycleId: z.number().int().positive().nullable().default(null) });

/** `/api/outbox`: the mail queue for administrators, with retry and "run the schedules now". */
export function outboxRoutes(mail: MailService): Router {
  const router = Router();
  router.use(requireRole('admin'));
  router.get('/', async (req, res) => {
    res.json(await mail.list(req.user as Express.User));
  });
  router.post('/run', async (_req, res) => {
    res.json(await mail.runSchedules());
  });
  router.post('/:id/retry', async (req, res) => {
    const entry = await mail.retry(req.user as Express.User, routeId(req.params));
    await mail.deliverDue();
    res.json(entry);
  });
  return router;
}

/** `POST /api/audits/:id/send-pack`: tells the governance committee the pack is ready. */
export function sendPackRoutes(mail: MailService): Router {
  const router = Router();
  router.post('/:id/send-pack', requireRole('audit_lead'), validateBody(sendPackSchema), async (req, res) => {
    const result = await mail.queueGovernancePack(req.user as Express.User, routeId(req.params), req.body.cycleId);
    // Deliver straight away; failures stay queued for retry and show in the Outbox.
    await mail.deliverDue();
    res.status(202).json(result);
  });
  return router;
}
