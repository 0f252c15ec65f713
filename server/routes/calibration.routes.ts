import { Router } from 'express';
import { calibrationReadingSchema } from '@tidemark/shared';
import { requireAuth } from '../middleware/require-role';
import { validateBody } from '../middleware/validate';
import type { CalibrationService } from '../services/calibration.service';

/** `/api/calibration-readings`: repeated readings for examiner calibration. */
export function calibrationRoutes(calibration: CalibrationService): Router {
  const router = Router();
  router.use(requireAuth);
  router.post('/', validateBody(calibrationReadingSchema), async (req, res) => {
    res.status(201).json(await calibration.add(req.user as Express.User, req.body));
  });
  return router;
}
