import { inject } from '@angular/core';
import { Route, Routes } from '@angular/router';
import { authGuard } from './core/auth/auth-guard';
import { AuthSession } from './core/auth/auth-session';
import { roleGuard } from './core/auth/role-guard';
import { SIGN_IN_PATH } from './core/auth/sign-in-path';
import { signedOutGuard } from './core/auth/signed-out-guard';
import { homePathFor, rolesFor } from './core/shell/navigation';
import type { ComingSoonData } from './shared/coming-soon/coming-soon';

/** A page that is announced but not built yet, guarded like the real one will be. */
function comingSoon(path: string, data: ComingSoonData): Route {
  return {
    path,
    title: data.heading,
    canActivate: [roleGuard(...rolesFor(`/${path}`))],
    loadComponent: () => import('./shared/coming-soon/coming-soon').then((m) => m.ComingSoon),
    data,
  };
}

const AUDITS_RELEASE = 'Arrives with the audits release.';
const GOVERNANCE_PACK_RELEASE = 'Arrives with the governance pack release.';

/** Top-level routes. Every page is lazy so the first download stays small. */
export const routes: Routes = [
  {
    path: SIGN_IN_PATH.slice(1),
    title: 'Sign in',
    canActivate: [signedOutGuard],
    loadComponent: () => import('./core/auth/sign-in/sign-in').then((m) => m.SignIn),
  },
  {
    path: '',
    canActivate: [authGuard],
    loadComponent: () => import('./core/shell/shell').then((m) => m.Shell),
    children: [
      {
        path: '',
        pathMatch: 'full',
        redirectTo: () => {
          const user = inject(AuthSession).user();
          return user ? homePathFor(user.role) : SIGN_IN_PATH;
        },
      },
      {
        path: 'today',
        title: 'Today',
        canActivate: [roleGuard(...rolesFor('/today'))],
        loadChildren: () => import('./features/today/today.routes').then((m) => m.TODAY_ROUTES),
      },
      {
        // Registering a case: the roles that record clinical data (DESIGN.md §2).
        path: 'cases/new',
        title: 'New case',
        canActivate: [roleGuard('audit_lead', 'clinician')],
        loadChildren: () => import('./features/case-entry/case-entry.routes').then((m) => m.CASE_ENTRY_ROUTES),
      },
      {
        // Entering or correcting one recall of a case.
        path: 'cases/:caseId/recall/:intervalKey',
        title: 'Recall entry',
        canActivate: [roleGuard('audit_lead', 'clinician')],
        loadChildren: () => import('./features/recall-entry/recall-entry.routes').then((m) => m.RECALL_ENTRY_ROUTES),
      },
      {
        path: 'cases',
        title: 'Cases',
        canActivate: [roleGuard(...rolesFor('/cases'))],
        loadChildren: () => import('./features/cases/cases.routes').then((m) => m.CASES_ROUTES),
      },
      comingSoon('audits', {
        heading: 'Audits',
        purpose:
          "Audits will hold each audit's scope, standards, results and cycles, with the action plan agreed after each cycle.",
        release: AUDITS_RELEASE,
      }),
      comingSoon('reports', {
        heading: 'Reports',
        purpose: 'Reports will build the de-identified governance workbook and send it to the committee by e-mail.',
        release: GOVERNANCE_PACK_RELEASE,
      }),
      {
        path: 'history',
        title: 'Change history',
        canActivate: [roleGuard(...rolesFor('/history'))],
        loadChildren: () => import('./features/history/history.routes').then((m) => m.HISTORY_ROUTES),
      },
      {
        path: 'team',
        title: 'Team',
        canActivate: [roleGuard(...rolesFor('/team'))],
        loadChildren: () => import('./features/team/team.routes').then((m) => m.TEAM_ROUTES),
      },
      comingSoon('outbox', {
        heading: 'Outbox',
        purpose: 'Outbox will list the e-mails Tidemark has sent or queued, so you can check what reached the committee.',
        release: GOVERNANCE_PACK_RELEASE,
      }),
      comingSoon('settings', {
        heading: 'Settings',
        purpose: 'Settings will hold the practice-wide defaults new audits start from, such as the recall schedule and stability thresholds.',
        release: 'Arrives with a later release.',
      }),
    ],
  },
  { path: '**', redirectTo: '' },
];
