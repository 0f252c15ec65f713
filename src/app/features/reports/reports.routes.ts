import { Routes } from '@angular/router';

/** Routes of the Reports feature; guarded where they are mounted (app.routes.ts). */
export const REPORTS_ROUTES: Routes = [
  {
    path: '',
    loadComponent: () => import('./reports-page/reports-page').then((m) => m.ReportsPage),
  },
];
