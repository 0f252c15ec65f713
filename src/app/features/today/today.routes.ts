import { Routes } from '@angular/router';

/** Routes of the Today feature; guarded where they are mounted (app.routes.ts). */
export const TODAY_ROUTES: Routes = [
  {
    path: '',
    loadComponent: () => import('./today-page/today-page').then((m) => m.TodayPage),
  },
];
