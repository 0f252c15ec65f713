import { Router, type RequestHandler, type Response } from 'express';
import multer from 'multer';
import { caseCreateSchema, caseListQuerySchema, caseUpdateSchema, complicationCreateSchema, PHOTO_MAX_BYTES, photoUploadSchema, siteCreateSchema, visitCreateSchema } from '@tidemark/shared';
import { HttpError } from '../http-error';
import { requireAuth } from '../middleware/require-role';
import { parseOrThrow, validateBody } from '../middleware/validate';
import type { CaseService } from '../services/case.service';
import type { ComplicationService } from '../services/complication.service';
import type { PhotoService } from '../services/photo.service';
import type { SiteService } from '../services/site.service';
import type { VisitService } from '../services/visit.service';
import { routeId } from './route-params';

/** The services the case routes use. */
export interface CaseRouteServices {
  cases: CaseService;
  sites: SiteService;
  visits: VisitService;
  complications: ComplicationService;
  photos: PhotoService;
}

/** Multipart parsing with hard limits (multer sets none by default). */
function singlePhoto(): RequestHandler {
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: PHOTO_MAX_BYTES, files: 1, fields: 10, fieldSize: 1024, parts: 12 } }).single('file');
  return (req, res, next) => {
    upload(req, res, (error: unknown) => {
      if (error instanceof multer.MulterError) {
        if (error.code === 'LIMIT_FILE_SIZE') return next(new HttpError(413, 'payload_too_large', 'The photograph is larger than 15 MB.'));
        return next(HttpError.badRequest(`The upload was refused: ${error.message}.`, { file: error.message }));
      }
      // busboy's own parse errors (a malformed part header, a missing boundary, a cut-off body) are the client's, not ours.
      if (error) return next(HttpError.badRequest('The upload is not a well-formed multipart form.', { file: 'Send the photograph again from the form.' }));
      next();
    });
  };
}

/** ETags of cached case list pages: a cached page's bytes never change, so each is hashed once, not per request. */
const pageEtags = new WeakMap<Buffer, string>();

/**
 * The ETag `res.send` would compute for `body` — with the app's own `etag fn`, so the header is the
 * one Express sends (weak, by default) — remembered per cached page. Undefined when ETags are off.
 */
function cachedPageEtag(res: Response, body: Buffer): string | undefined {
  const etagOf: unknown = res.app.get('etag fn');
  if (typeof etagOf !== 'function') return undefined;
  let etag = pageEtags.get(body);
  if (etag === undefined) {
    etag = String(etagOf(body));
    pageEtags.set(body, etag);
  }
  return etag;
}

/** `/api/cases` and the records that hang off a case. */
export function caseRoutes(services: CaseRouteServices): Router {
  const router = Router();
  router.use(requireAuth);

  router.get('/', async (req, res) => {
    const body = await services.cases.listJson(req.user as Express.User, parseOrThrow(caseListQuerySchema, req.query));
    // Already JSON (kept serialised by the case list cache): the same bytes and headers res.json would send.
    res.setHeader('Content-Type', 'application/json; charset=utf-8');
    const etag = cachedPageEtag(res, body);
    if (etag) res.setHeader('ETag', etag);
    res.send(body);
  });
  router.post('/', validateBody(caseCreateSchema), async (req, res) => {
    res.status(201).json(await services.cases.create(req.user as Express.User, req.body));
  });
  router.get('/:id', async (req, res) => {
    res.json(await services.cases.get(req.user as Express.User, routeId(req.params)));
  });
  router.patch('/:id', validateBody(caseUpdateSchema), async (req, res) => {
    res.json(await services.cases.update(req.user as Express.User, routeId(req.params), req.body));
  });
  router.post('/:id/sites', validateBody(siteCreateSchema), async (req, res) => {
    res.status(201).json(await services.sites.add(req.user as Express.User, routeId(req.params), req.body));
  });
  router.post('/:id/visits', validateBody(visitCreateSchema), async (req, res) => {
    res.status(201).json(await services.visits.create(req.user as Express.User, routeId(req.params), req.body));
  });
  router.post('/:id/complications', validateBody(complicationCreateSchema), async (req, res) => {
    res.status(201).json(await services.complications.create(req.user as Express.User, routeId(req.params), req.body));
  });
  // Ownership is checked before multer reads up to 15 MB into memory.
  const mayUpload: RequestHandler = async (req, _res, next) => {
    await services.cases.findCase(services.cases.manager, req.user as Express.User, routeId(req.params), 'write');
    next();
  };
  router.post('/:id/photos', mayUpload, singlePhoto(), async (req, res) => {
    const id = routeId(req.params);
    const fields = parseOrThrow(photoUploadSchema, req.body ?? {});
    res.status(201).json(await services.photos.upload(req.user as Express.User, id, req.file?.buffer, fields));
  });
  return router;
}
