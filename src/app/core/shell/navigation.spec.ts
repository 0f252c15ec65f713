import { ROLES, type Role } from '@tidemark/shared';
import { homePathFor, navigationFor, rolesFor } from './navigation';

describe('navigationFor', () => {
  const expected: Record<Role, string[]> = {
    admin: ['Cases', 'Change history', 'Team', 'Outbox', 'Settings'],
    audit_lead: ['Today', 'Cases', 'Audits', 'Reports', 'Change history'],
    clinician: ['Today', 'Cases', 'Audits', 'Change history'],
    partner: ['Cases', 'Audits', 'Reports', 'Change history'],
    governance: ['Audits', 'Reports'],
  };

  it.each(ROLES)('gives %s exactly its own pages, in order', (role) => {
    expect(navigationFor(role).map((item) => item.label)).toEqual(expected[role]);
  });

  it('makes the first page each role home', () => {
    expect(ROLES.map((role) => homePathFor(role))).toEqual(['/cases', '/today', '/today', '/cases', '/audits']);
  });

  it('gives every page a distinct path and an icon', () => {
    const items = ROLES.flatMap((role) => navigationFor(role));
    const paths = new Set(items.map((item) => item.path));
    expect([...paths].sort()).toEqual(
      ['/audits', '/cases', '/history', '/outbox', '/reports', '/settings', '/team', '/today'].sort(),
    );
    expect(items.every((item) => item.icon.length > 0)).toBe(true);
  });

  it('answers route guards with the same roles as the menu', () => {
    expect(rolesFor('/team')).toEqual(['admin']);
    expect(rolesFor('/reports')).toEqual(['audit_lead', 'partner', 'governance']);
    expect(() => rolesFor('/nowhere')).toThrowError(/No navigation entry/);
  });
});
