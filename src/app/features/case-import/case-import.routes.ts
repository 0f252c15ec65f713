import { Routes } from '@angular/router';

/** Routes of the case import (audit lead only; guarded where it is mounted in app.routes.ts). */
export const CASE_IMPORT_ROUTES: Routes = [
  {
    path: '',
    loadComponent: () => import('./import-page/import-page').then((m) => m.ImportPage),
  },
];
