import { Routes } from '@angular/router';

/** Routes of the New case feature (audit lead and clinicians; guarded where it is mounted). */
export const CASE_ENTRY_ROUTES: Routes = [
  {
    path: '',
    loadComponent: () => import('./new-case-page/new-case-page').then((m) => m.NewCasePage),
  },
];
