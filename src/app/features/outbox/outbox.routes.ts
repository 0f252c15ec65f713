import { Routes } from '@angular/router';

/** Routes of the Outbox feature (admin only; guarded where it is mounted). */
export const OUTBOX_ROUTES: Routes = [
  {
    path: '',
    loadComponent: () => import('./outbox-page/outbox-page').then((m) => m.OutboxPage),
  },
];
