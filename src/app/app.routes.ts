import { inject } from '@angular/core';
import { Routes } from '@angular/router';
import { ACCOUNT_SECURITY_PATH } from './core/auth/account-security-path';
import { authGuard } from './core/auth/auth-guard';
import { AuthSession } from './core/auth/auth-session';
import { enrolmentGuard } from './core/auth/enrolment-guard';
import { roleGuard } from './core/auth/role-guard';
import { SIGN_IN_PATH } from './core/auth/sign-in-path';
import { signedOutGuard } from './core/auth/signed-out-guard';
import { homePathFor, rolesFor } from './core/shell/navigation';

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
    // A role that must use one-time codes and has none yet sees only Sign-in protection.
    canActivateChild: [enrolmentGuard],
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
        // Importing past cases from a spreadsheet (audit lead); before 'cases' so ':id' never takes "import".
        path: 'cases/import',
        title: 'Import past cases',
        canActivate: [roleGuard('audit_lead')],
        loadChildren: () => import('./features/case-import/case-import.routes').then((m) => m.CASE_IMPORT_ROUTES),
      },
      {
        path: 'cases',
        title: 'Cases',
        canActivate: [roleGuard(...rolesFor('/cases'))],
        loadChildren: () => import('./features/cases/cases.routes').then((m) => m.CASES_ROUTES),
      },
      {
        path: 'audits',
        title: 'Audits',
        canActivate: [roleGuard(...rolesFor('/audits'))],
        loadChildren: () => import('./features/audits/audits.routes').then((m) => m.AUDITS_ROUTES),
      },
      {
        path: 'reports',
        title: 'Reports',
        canActivate: [roleGuard(...rolesFor('/reports'))],
        loadChildren: () => import('./features/reports/reports.routes').then((m) => m.REPORTS_ROUTES),
      },
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
      {
        path: 'outbox',
        title: 'Outbox',
        canActivate: [roleGuard(...rolesFor('/outbox'))],
        loadChildren: () => import('./features/outbox/outbox.routes').then((m) => m.OUTBOX_ROUTES),
      },
      {
        // The signed-in person's own one-time codes: every role (reached from the person menu).
        path: ACCOUNT_SECURITY_PATH.slice(1),
        title: 'Sign-in protection',
        loadChildren: () => import('./features/account-security/account-security.routes').then((m) => m.ACCOUNT_SECURITY_ROUTES),
      },
      {
        // The installation overview and backups (administrator).
        path: 'settings',
        title: 'Settings',
        canActivate: [roleGuard(...rolesFor('/settings'))],
        loadChildren: () => import('./features/settings/settings.routes').then((m) => m.SETTINGS_ROUTES),
      },
    ],
  },
  { path: '**', redirectTo: '' },
];
