import { Router } from 'express';
import { z } from 'zod';
import { patientCreateSchema, patientUpdateSchema } from '@tidemark/shared';
import { requireAuth } from '../middleware/require-role';
import { parseOrThrow, validateBody } from '../middleware/validate';
import type { PatientService } from '../services/patient.service';
import { routeId } from './route-params';

const listQuery = z.object({ code: z.string().trim().max(20).optional() });

/** `/api/patients`: pseudonymised patients (access rules in the service). */
export function patientRoutes(patients: PatientService): Router {
  const router = Router();
  router.use(requireAuth);
  router.get('/', async (req, res) => {
    res.json(await patients.list(req.user as Express.User, parseOrThrow(listQuery, req.query).code));
  });
  router.post('/', validateBody(patientCreateSchema), async (req, res) => {
    res.status(201).json(await patients.create(req.user as Express.User, req.body));
  });
  router.get('/:id', async (req, res) => {
    res.json(await patients.get(req.user as Express.User, routeId(req.params)));
  });
  router.patch('/:id', validateBody(patientUpdateSchema), async (req, res) => {
    res.json(await patients.update(req.user as Express.User, routeId(req.params), req.body));
  });
  return router;
}
