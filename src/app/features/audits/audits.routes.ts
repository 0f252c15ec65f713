import { Routes } from '@angular/router';
import { roleGuard } from '../../core/auth/role-guard';

/** Routes of the Audits feature; the feature as a whole is guarded where it is mounted (app.routes.ts). */
export const AUDITS_ROUTES: Routes = [
  {
    path: '',
    loadComponent: () => import('./audit-list/audit-list').then((m) => m.AuditList),
  },
  {
    // Only the audit lead defines audits (DESIGN.md §2); listed before ':id' so "new" is not read as an id.
    path: 'new',
    title: 'New audit',
    canActivate: [roleGuard('audit_lead')],
    loadComponent: () => import('./new-audit-page/new-audit-page').then((m) => m.NewAuditPage),
  },
  {
    path: ':id',
    title: 'Audit',
    loadComponent: () => import('./audit-page/audit-page').then((m) => m.AuditPage),
  },
];
