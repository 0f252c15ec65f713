import { Routes } from '@angular/router';

/** Routes of the Sign-in protection feature (every role; mounted at /account/security). */
export const ACCOUNT_SECURITY_ROUTES: Routes = [
  {
    path: '',
    loadComponent: () => import('./security-page/security-page').then((m) => m.SecurityPage),
  },
];
