import { Router } from 'express';
import { complicationUpdateSchema, siteUpdateSchema, visitUpdateSchema } from '@tidemark/shared';
import { requireAuth } from '../middleware/require-role';
import { validateBody } from '../middleware/validate';
import type { ComplicationService } from '../services/complication.service';
import type { SiteService } from '../services/site.service';
import type { VisitService } from '../services/visit.service';
import { routeId } from './route-params';

/** `PATCH /api/sites/:id`. */
export function siteRoutes(sites: SiteService): Router {
  const router = Router();
  router.use(requireAuth);
  router.patch('/:id', validateBody(siteUpdateSchema), async (req, res) => {
    res.json(await sites.update(req.user as Express.User, routeId(req.params), req.body));
  });
  return router;
}

/** `PATCH /api/visits/:id`. */
export function visitRoutes(visits: VisitService): Router {
  const router = Router();
  router.use(requireAuth);
  router.patch('/:id', validateBody(visitUpdateSchema), async (req, res) => {
    res.json(await visits.update(req.user as Express.User, routeId(req.params), req.body));
  });
  return router;
}

/** `PATCH /api/complications/:id`. */
export function complicationRoutes(complications: ComplicationService): Router {
  const router = Router();
  router.use(requireAuth);
  router.patch('/:id', validateBody(complicationUpdateSchema), async (req, res) => {
    res.json(await complications.update(req.user as Express.User, routeId(req.params), req.body));
  });
  return router;
}
