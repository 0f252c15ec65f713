import type { Role } from '@tidemark/shared';

/** One entry of the main navigation. */
export interface NavigationItem {
  /** Absolute route path, e.g. `/cases`. */
  readonly path: string;
  /** Link text. */
  readonly label: string;
  /** Material Symbols ligature name. */
  readonly icon: string;
  /** Roles that may open the page (DESIGN.md §2). */
  readonly roles: readonly Role[];
}

/**
 * Every page of the shell, in menu order. This is the single place that says which
 * role may use which page: the menu and the route guards both read it.
 */
export const NAVIGATION: readonly NavigationItem[] = [
  { path: '/today', label: 'Today', icon: 'event_upcoming', roles: ['audit_lead', 'clinician'] },
  { path: '/cases', label: 'Cases', icon: 'dentistry', roles: ['admin', 'audit_lead', 'clinician', 'partner'] },
  { path: '/audits', label: 'Audits', icon: 'fact_check', roles: ['audit_lead', 'clinician', 'partner', 'governance'] },
  { path: '/reports', label: 'Reports', icon: 'summarize', roles: ['audit_lead', 'partner', 'governance'] },
  { path: '/history', label: 'Change history', icon: 'history', roles: ['admin', 'audit_lead', 'clinician', 'partner'] },
  { path: '/team', label: 'Team', icon: 'group', roles: ['admin'] },
  { path: '/outbox', label: 'Outbox', icon: 'outbox', roles: ['admin'] },
  { path: '/settings', label: 'Settings', icon: 'settings', roles: ['admin'] },
];

/** The menu a role sees, in order. */
export function navigationFor(role: Role): readonly NavigationItem[] {
  return NAVIGATION.filter((item) => item.roles.includes(role));
}

/** A role's home page: the first entry of its menu. */
export function homePathFor(role: Role): string {
  const [home] = navigationFor(role);
  if (!home) {
    throw new Error(`Role "${role}" has no pages in the navigation.`);
  }
  return home.path;
}

/** The roles allowed on a page, looked up by its path (for route guards). */
export function rolesFor(path: string): readonly Role[] {
  const item = NAVIGATION.find((entry) => entry.path === path);
  if (!item) {
    throw new Error(`No navigation entry for "${path}".`);
  }
  return item.roles;
}
