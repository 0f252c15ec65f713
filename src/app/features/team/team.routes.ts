import { Routes } from '@angular/router';

/** Routes of the Team feature (admin only; guarded where it is mounted). */
export const TEAM_ROUTES: Routes = [
  {
    path: '',
    loadComponent: () => import('./team-page/team-page').then((m) => m.TeamPage),
  },
];
