import { Router } from 'express';
import { requireAuth } from '../middleware/require-role';
import type { PhotoService } from '../services/photo.service';
import { routeId } from './route-params';

/** `GET /api/photos/:id` and `/:id/thumbnail`: served only to those who may see the case. */
export function photoRoutes(photos: PhotoService): Router {
  const router = Router();
  router.use(requireAuth);
  for (const [suffix, variant] of [['', 'full'], ['/thumbnail', 'thumbnail']] as const) {
    router.get(`/:id${suffix}`, async (req, res) => {
      const { bytes, contentType } = await photos.read(req.user as Express.User, routeId(req.params), variant);
      res.setHeader('Content-Type', contentType);
      // Revalidated on every view (ETag → 304), never served stale from a shared or browser cache.
      res.setHeader('Cache-Control', 'private, no-cache');
      res.setHeader('Content-Disposition', 'inline');
      res.send(bytes);
    });
  }
  return router;
}
