import type { Role } from '../../shared/schemas/auth.schema';

export interface NavItem {
  to: string;
  label: string;
  /** Who sees it; admin sees everything. Empty = everyone signed in. */
  roles: Role[];
  section: 'work' | 'admin';
}

/** The one table of navigation; pages join it with the roles that may open them. */
export const NAV: NavItem[] = [
  { to: '/', label: 'Home', roles: [], section: 'work' },
  { to: '/programs', label: 'Programs', roles: ['engineer'], section: 'work' },
  { to: '/library', label: 'Library', roles: ['librarian', 'engineer'], section: 'work' },
  { to: '/run-files', label: 'Run files', roles: ['operator', 'engineer'], section: 'work' },
  { to: '/panel-preview', label: 'Panel preview', roles: ['engineer'], section: 'work' },
  { to: '/tokens', label: 'Line access', roles: ['engineer'], section: 'work' },
  { to: '/account', label: 'Account', roles: [], section: 'work' },
  { to: '/admin/users', label: 'Users', roles: ['admin'], section: 'admin' },
  { to: '/admin/audit', label: 'Audit log', roles: ['admin'], section: 'admin' },
  { to: '/admin/outbox', label: 'Outbox', roles: ['admin'], section: 'admin' },
];

export function navFor(roles: readonly Role[]): NavItem[] {
  const admin = roles.includes('admin');
  return NAV.filter((n) => admin || n.roles.length === 0 || n.roles.some((r) => roles.includes(r)));
}
