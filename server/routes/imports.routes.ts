import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import * as z from 'zod';
import { IMPORT_MAX_BYTES } from '@tidemark/shared';
import { HttpError } from '../http-error';
import type { ImportService } from '../import/import.service';
import { requireRole } from '../middleware/require-role';
import { parseOrThrow } from '../middleware/validate';
import { signedInUser } from './signed-in-user';

const jobParams = z.object({ jobId: z.uuid('Not a valid job id.') });

/** One file in field `file`, at most 10 MB, held in memory (never stored). */
function singleImportFile(): RequestHandler {
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: IMPORT_MAX_BYTES, files: 1, fields: 5, fieldSize: 1024, parts: 6 } }).single('file');
  return (req, res, next) => {
    upload(req, res, (error: unknown) => {
      if (error instanceof multer.MulterError) {
        if (error.code === 'LIMIT_FILE_SIZE') return next(new HttpError(413, 'payload_too_large', 'The file is larger than 10 MB. Split it and import the parts one after another.'));
        return next(HttpError.badRequest(`The upload was refused: ${error.message}.`, { file: error.message }));
      }
      // busboy's own parse errors (a malformed part header, a missing boundary, a cut-off body) are the client's, not ours.
      if (error) return next(HttpError.badRequest('The upload is not a well-formed multipart form.', { file: 'Send the file again from the form.' }));
      next();
    });
  };
}

/** `/api/imports`: the template, uploads (202 + job), progress and the list of problems. Audit lead only. */
export function importRoutes(imports: ImportService): Router {
  const router = Router();
  // The role is checked before multer reads up to 10 MB.
  router.use(requireRole('audit_lead'));
  router.get('/template.xlsx', async (req, res) => {
    const bytes = await imports.template(signedInUser(req), 'xlsx');
    res.attachment('tidemark-import-template.xlsx').type('application/vnd.openxmlformats-officedocument.spreadsheetml.sheet').send(bytes);
  });
  router.get('/template.csv', async (req, res) => {
    const bytes = await imports.template(signedInUser(req), 'csv');
    res.attachment('tidemark-import-template.csv').type('text/csv; charset=utf-8').send(bytes);
  });
  router.post('/', singleImportFile(), async (req, res) => {
    res.status(202).json(await imports.start(signedInUser(req), req.file?.buffer));
  });
  router.get('/:jobId', (req, res) => {
    res.setHeader('Cache-Control', 'no-store');
    res.json(imports.status(signedInUser(req), parseOrThrow(jobParams, req.params).jobId));
  });
  router.get('/:jobId/errors.csv', (req, res) => {
    const csv = imports.errorsCsv(signedInUser(req), parseOrThrow(jobParams, req.params).jobId);
    res.setHeader('Cache-Control', 'no-store');
    res.attachment('tidemark-import-problems.csv').type('text/csv; charset=utf-8').send(csv);
  });
  return router;
}
