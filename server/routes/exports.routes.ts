import { Router } from 'express';
import * as z from 'zod';
import { EXPORT_ROLES, type GovernanceExportService } from '../export/governance-export.service';
import { HttpError } from '../http-error';
import { requireRole } from '../middleware/require-role';
import { parseOrThrow, validateBody } from '../middleware/validate';
import { routeId } from './route-params';
import { signedInUser } from './signed-in-user';

/** `POST /api/audits/:id/exports` body: live results (no cycle) or one cycle. */
export const exportStartSchema = z.object({ cycleId: z.number().int().positive().nullable().default(null) });
const jobParams = z.object({ jobId: z.uuid('Not a valid job id.') });

/** `POST /api/audits/:id/exports` → 202 { jobId }: starts a governance workbook. */
export function auditExportRoutes(exports: GovernanceExportService): Router {
  const router = Router();
  router.post('/:id/exports', requireRole(...EXPORT_ROLES), validateBody(exportStartSchema), async (req, res) => {
    res.status(202).json(await exports.start(signedInUser(req), routeId(req.params), req.body.cycleId));
  });
  return router;
}

/** `GET /api/exports/:jobId` (progress) and `/:jobId/file` (the workbook, for whoever started it). */
export function exportRoutes(exports: GovernanceExportService): Router {
  const router = Router();
  router.use(requireRole(...EXPORT_ROLES));
  router.get('/:jobId', (req, res) => {
    res.setHeader('Cache-Control', 'no-store');
    res.json(exports.status(signedInUser(req), parseOrThrow(jobParams, req.params).jobId));
  });
  router.get('/:jobId/file', (req, res, next) => {
    const file = exports.file(signedInUser(req), parseOrThrow(jobParams, req.params).jobId);
    res.setHeader('Cache-Control', 'no-store');
    res.download(file.path, file.downloadName, (error) => {
      // A file swept between the check and the send is simply gone.
      if (error && !res.headersSent) next(HttpError.notFound('The workbook'));
    });
  });
  return router;
}
