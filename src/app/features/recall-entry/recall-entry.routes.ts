import { Routes } from '@angular/router';

/** Routes of the Recall entry feature, mounted at `/cases/:caseId/recall/:intervalKey` (guarded there). */
export const RECALL_ENTRY_ROUTES: Routes = [
  {
    path: '',
    loadComponent: () => import('./recall-entry-page/recall-entry-page').then((m) => m.RecallEntryPage),
  },
];
