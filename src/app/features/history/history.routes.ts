import { Routes } from '@angular/router';

/** Routes of the Change history feature; guarded where they are mounted (app.routes.ts). */
export const HISTORY_ROUTES: Routes = [
  {
    path: '',
    loadComponent: () => import('./history-page/history-page').then((m) => m.HistoryPage),
  },
];
