import { Router } from 'express';
import { ownSessionHandleSchema } from '@tidemark/shared';
import { logSessionsEnded } from '../logging/security-events';
import { requireAuth } from '../middleware/require-role';
import { parseOrThrow } from '../middleware/validate';
import type { OwnSessionsService } from '../services/own-sessions.service';
import { signedInUser } from './signed-in-user';

/**
 * `/api/auth/sessions`: the signed-in member's own sessions — list them, end one, end all the
 * others (OWASP ASVS 5.0 §7.5.2).
 */
export function ownSessionRoutes(sessions: OwnSessionsService): Router {
  const router = Router();
  router.use(requireAuth);

  router.get('/', async (req, res) => {
    res.json(await sessions.list(signedInUser(req).id, req.sessionID));
  });

  router.post('/end-others', async (req, res) => {
    const userId = signedInUser(req).id;
    const ended = await sessions.endOthers(userId, req.sessionID);
    logSessionsEnded(req, userId, 'own_others', ended.endedSessions);
    res.json(ended);
  });

  router.delete('/:id', async (req, res) => {
    const { id } = parseOrThrow(ownSessionHandleSchema, req.params);
    const userId = signedInUser(req).id;
    await sessions.end(userId, id, req.sessionID);
    logSessionsEnded(req, userId, 'own_one', 1);
    res.status(204).end();
  });

  return router;
}
