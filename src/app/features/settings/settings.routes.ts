import { Routes } from '@angular/router';

/** Routes of the Settings feature (administrator only; guarded where it is mounted). */
export const SETTINGS_ROUTES: Routes = [
  {
    path: '',
    loadComponent: () => import('./settings-page/settings-page').then((m) => m.SettingsPage),
  },
];
