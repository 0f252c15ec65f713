import { Routes } from '@angular/router';

/** Routes of the Cases feature; guarded where they are mounted (app.routes.ts). */
export const CASES_ROUTES: Routes = [
  {
    path: '',
    loadComponent: () => import('./case-list/case-list').then((m) => m.CaseList),
  },
  {
    path: ':id',
    title: 'Case',
    loadComponent: () => import('./case-page/case-page').then((m) => m.CasePage),
  },
];
