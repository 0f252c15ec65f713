import { Router } from 'express';
import { z } from 'zod';
import { isoDate } from '@tidemark/shared';
import { requireAuth, requireRole } from '../middleware/require-role';
import { parseOrThrow } from '../middleware/validate';
import type { HistoryService } from '../services/history.service';
import type { OperatorDirectory } from '../services/operator-directory';
import type { RecallService } from '../services/recall.service';

const historyQuery = z.object({
  caseId: z.coerce.number().int().positive().optional(),
  page: z.coerce.number().int().min(0).default(0),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});
const dueQuery = z.object({ asOf: isoDate.optional() });

/** `GET /api/recalls/due`: the Today list (clinicians: own cases; audit lead: everyone's). */
export function recallRoutes(recalls: RecallService): Router {
  const router = Router();
  router.get('/due', requireRole('clinician', 'audit_lead'), async (req, res) => {
    res.json(await recalls.due(req.user as Express.User, parseOrThrow(dueQuery, req.query).asOf));
  });
  return router;
}

/** `GET /api/history`: the change history. */
export function historyRoutes(history: HistoryService): Router {
  const router = Router();
  router.get('/', requireAuth, async (req, res) => {
    res.json(await history.list(req.user as Express.User, parseOrThrow(historyQuery, req.query)));
  });
  return router;
}

/** `GET /api/operators`: who may operate, for pickers and filters. */
export function operatorRoutes(operators: OperatorDirectory): Router {
  const router = Router();
  router.get('/', requireRole('admin', 'audit_lead', 'clinician', 'partner'), async (_req, res) => {
    res.json(await operators.listOperators());
  });
  return router;
}
