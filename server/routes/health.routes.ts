import { Router } from 'express';
import type { DataSource } from 'typeorm';

/** `GET /api/health`: ok only after a real database round trip. */
export function healthRoutes(dataSource: DataSource): Router {
  const router = Router();
  router.get('/', async (_req, res) => {
    try {
      await dataSource.query('SELECT 1');
      res.json({ status: 'ok' });
    } catch {
      // The database is the service: without it we are unavailable, not broken.
      res.status(503).json({ error: { code: 'unavailable', message: 'The database is not reachable.' } });
    }
  });
  return router;
}
