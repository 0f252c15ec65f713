import { Router, type Request } from 'express';
import * as z from 'zod';
import {
  GROUP_BY_OPTIONS,
  actionItemCreateSchema,
  actionItemUpdateSchema,
  auditCreateSchema,
  auditUpdateSchema,
  cohortPreviewSchema,
  cycleCreateSchema,
  cycleUpdateSchema,
  resultsNarrowingSchema,
  reviewNoteCreateSchema,
  standardCreateSchema,
  standardUpdateSchema,
} from '@tidemark/shared';
import { requireAuth } from '../middleware/require-role';
import { parseOrThrow, validateBody } from '../middleware/validate';
import type { AuditCycleService } from '../services/audit-cycle.service';
import type { AuditDatasetService } from '../services/audit-dataset.service';
import type { AuditResultsService } from '../services/audit-results.service';
import type { AuditService } from '../services/audit.service';
import { assertAuditReader } from '../services/audit-access';
import { routeId } from './route-params';

/** The services the audit routes use. */
export interface AuditRouteServices {
  audits: AuditService;
  cycles: AuditCycleService;
  results: AuditResultsService;
  datasets: AuditDatasetService;
}

const cycleScope = z.object({ cycleId: z.coerce.number().int().positive().optional() });
/** Live or a cycle, narrowed to a phenotype and/or an operator when asked. */
const narrowedScope = cycleScope.extend(resultsNarrowingSchema.shape);
const resultsQuery = narrowedScope.extend({ groupBy: z.enum(GROUP_BY_OPTIONS).optional() });
// The funnel compares every operator, so only the phenotype narrows it.
const funnelQuery = cycleScope.extend({
  phenotype: resultsNarrowingSchema.shape.phenotype,
  measure: z.enum(['complication', 'relapse']).default('complication'),
  intervalKey: z.string().max(20).optional(),
});
const trendQuery = narrowedScope.extend({ intervalKey: z.string().max(20).optional() });
const compareQuery = z.object({ first: z.coerce.number().int().positive(), second: z.coerce.number().int().positive() });

/** `/api/audits`: audits, their standards, cycles, notes and every result view. */
export function auditRoutes(services: AuditRouteServices): Router {
  const router = Router();
  router.use(requireAuth);
  const user = (req: Request): Express.User => req.user as Express.User;

  router.get('/', async (req, res) => {
    res.json(await services.audits.list(user(req)));
  });
  router.post('/', validateBody(auditCreateSchema), async (req, res) => {
    res.status(201).json(await services.audits.create(user(req), req.body));
  });
  router.post('/cohort-preview', validateBody(cohortPreviewSchema), async (req, res) => {
    assertAuditReader(user(req));
    res.json(await services.datasets.preview(req.body.cohort));
  });
  router.get('/:id', async (req, res) => {
    res.json(await services.audits.get(user(req), routeId(req.params)));
  });
  router.patch('/:id', validateBody(auditUpdateSchema), async (req, res) => {
    res.json(await services.audits.update(user(req), routeId(req.params), req.body));
  });
  router.delete('/:id', async (req, res) => {
    await services.audits.remove(user(req), routeId(req.params));
    res.status(204).end();
  });

  router.post('/:id/standards', validateBody(standardCreateSchema), async (req, res) => {
    res.status(201).json(await services.audits.addStandard(user(req), routeId(req.params), req.body));
  });
  router.post('/:id/cycles', validateBody(cycleCreateSchema), async (req, res) => {
    res.status(201).json(await services.cycles.create(user(req), routeId(req.params), req.body));
  });
  router.get('/:id/notes', async (req, res) => {
    res.json(await services.cycles.notes(user(req), routeId(req.params)));
  });
  router.post('/:id/notes', validateBody(reviewNoteCreateSchema), async (req, res) => {
    res.status(201).json(await services.cycles.addNote(user(req), routeId(req.params), req.body));
  });

  router.get('/:id/results', async (req, res) => {
    const results = await services.results.results(user(req), routeId(req.params), parseOrThrow(resultsQuery, req.query));
    // Patient-derived and per-viewer: no shared caches, and revalidate every time (Express's ETag
    // then answers an unchanged result with 304; RFC 9111 §5.2.2.4, §5.2.2.7).
    res.set('Cache-Control', 'private, no-cache');
    res.json(results);
  });
  router.get('/:id/funnel', async (req, res) => {
    res.json(await services.results.funnel(user(req), routeId(req.params), parseOrThrow(funnelQuery, req.query)));
  });
  router.get('/:id/trend', async (req, res) => {
    res.json(await services.results.trend(user(req), routeId(req.params), parseOrThrow(trendQuery, req.query)));
  });
  router.get('/:id/survival', async (req, res) => {
    res.json(await services.results.survival(user(req), routeId(req.params), parseOrThrow(narrowedScope, req.query)));
  });
  router.get('/:id/calibration', async (req, res) => {
    res.json(await services.results.calibration(user(req), routeId(req.params), parseOrThrow(narrowedScope, req.query)));
  });
  router.get('/:id/compare', async (req, res) => {
    const query = parseOrThrow(compareQuery, req.query);
    res.json(await services.results.compare(user(req), routeId(req.params), query.first, query.second));
  });
  return router;
}

/** `/api/standards/:id`, `/api/cycles/:id`, `/api/actions/:id`: edits of an audit's parts. */
export function auditPartRoutes(services: AuditRouteServices): { standards: Router; cycles: Router; actions: Router } {
  const standards = Router();
  const cycles = Router();
  const actions = Router();
  for (const router of [standards, cycles, actions]) router.use(requireAuth);
  const user = (req: Request): Express.User => req.user as Express.User;

  standards.patch('/:id', validateBody(standardUpdateSchema), async (req, res) => {
    res.json(await services.audits.updateStandard(user(req), routeId(req.params), req.body));
  });
  standards.delete('/:id', async (req, res) => {
    await services.audits.removeStandard(user(req), routeId(req.params));
    res.status(204).end();
  });
  cycles.patch('/:id', validateBody(cycleUpdateSchema), async (req, res) => {
    res.json(await services.cycles.update(user(req), routeId(req.params), req.body));
  });
  cycles.delete('/:id', async (req, res) => {
    await services.cycles.remove(user(req), routeId(req.params));
    res.status(204).end();
  });
  cycles.post('/:id/actions', validateBody(actionItemCreateSchema), async (req, res) => {
    res.status(201).json(await services.cycles.addAction(user(req), routeId(req.params), req.body));
  });
  actions.patch('/:id', validateBody(actionItemUpdateSchema), async (req, res) => {
    res.json(await services.cycles.updateAction(user(req), routeId(req.params), req.body));
  });
  actions.delete('/:id', async (req, res) => {
    await services.cycles.removeAction(user(req), routeId(req.params));
    res.status(204).end();
  });
  return { standards, cycles, actions };
}
