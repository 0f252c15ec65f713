import { Router } from 'express';
import { requireRole } from '../middleware/require-role';
import type { SystemOverviewService } from '../services/system-overview.service';

/** `/api/settings`: the installation overview and backups, administrator only (DESIGN.md §2: settings). */
export function settingsRoutes(overview: SystemOverviewService): Router {
  const router = Router();
  router.use(requireRole('admin'));

  router.get('/system', async (_req, res) => {
    res.json(await overview.describe());
  });

  // Takes no input: a backup of the whole SQLite file (and the photographs it refers to in the uploads folder), now. 409 on PostgreSQL.
  router.post('/backups', async (_req, res) => {
    res.status(201).json(await overview.takeBackup());
  });

  return router;
}
