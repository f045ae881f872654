/**
 * What each role sees on the client. The server enforces every permission;
 * this only keeps people from being shown places they cannot use.
 */
import { ROLES, type Role, type User } from '@/types/api';

export const ROLE_LABELS: Record<Role, string> = {
  technician: 'Technician',
  reviewer: 'Reviewer',
  client: 'Client',
  admin: 'Administrator',
};

export interface RoleHome {
  role: Role;
  path: string;
  /** The page's name in navigation and as its heading. */
  label: string;
  /** The rail group this entry sits under. */
  group: string;
}

/** Ordered as the work flows: bench, review, the client who receives it, then the system. */
export const ROLE_HOMES: Record<Role, RoleHome> = {
  technician: { role: 'technician', path: '/bench', label: 'Open work', group: 'Bench' },
  reviewer: { role: 'reviewer', path: '/review', label: 'Review queue', group: 'Review' },
  client: { role: 'client', path: '/orders', label: 'Orders and certificates', group: 'Your orders' },
  admin: { role: 'admin', path: '/system', label: 'System overview', group: 'Administration' },
};

export const OVERVIEW_PATH = '/';

/** Further pages under a role's group, after its home. */
export const ROLE_EXTRA_PAGES: Partial<Record<Role, { label: string; to: string }[]>> = {
  client: [{ label: 'Request new work', to: '/orders/request' }],
  admin: [
    { label: 'People', to: '/admin/people' },
    { label: 'Organisations', to: '/admin/organisations' },
    { label: 'Storage and retention', to: '/admin/storage' },
    { label: 'Audit log', to: '/admin/audit' },
    { label: 'Outbound mail', to: '/admin/mail' },
  ],
};

/** The user's known roles, without duplicates, in the order of the work. */
export function rolesInWorkOrder(roles: readonly string[]): Role[] {
  return ROLES.filter((role) => roles.includes(role));
}

export function hasAnyRole(user: Pick<User, 'roles'>, allowed: readonly Role[]): boolean {
  return user.roles.some((role) => allowed.includes(role));
}

export interface NavigationGroup {
  label: string;
  entries: { label: string; to: string }[];
}

export function navigationFor(user: Pick<User, 'roles'>): NavigationGroup[] {
  const roles = rolesInWorkOrder(user.roles);
  const groups: NavigationGroup[] = [];
  if (roles.length > 1) groups.push({ label: 'All roles', entries: [{ label: 'Overview', to: OVERVIEW_PATH }] });
  for (const role of roles) {
    const home = ROLE_HOMES[role];
    groups.push({ label: home.group, entries: [{ label: home.label, to: home.path }, ...(ROLE_EXTRA_PAGES[role] ?? [])] });
  }
  // The records the work runs through; a client's work-order list is filtered to its own organisation by the server.
  const records: NavigationGroup['entries'] = [];
  if (roles.length > 0) records.push({ label: 'Work orders', to: '/work-orders' });
  if (hasAnyRole({ roles }, ['technician', 'reviewer', 'admin'])) records.push({ label: 'Equipment', to: '/equipment' });
  if (records.length > 0) groups.push({ label: 'Records', entries: records });
  return groups;
}

export type HomeChoice =
  | { kind: 'no-role' }
  | { kind: 'single'; home: RoleHome }
  | { kind: 'combined'; homes: RoleHome[] };

/** What `/` shows: one role goes straight to its home; several see them together. */
export function chooseHome(user: Pick<User, 'roles'>): HomeChoice {
  const roles = rolesInWorkOrder(user.roles);
  if (roles.length === 0) return { kind: 'no-role' };
  if (roles.length === 1) return { kind: 'single', home: ROLE_HOMES[roles[0]] };
  return { kind: 'combined', homes: roles.map((role) => ROLE_HOMES[role]) };
}

export function describeRoles(roles: readonly string[]): string {
  const known = rolesInWorkOrder(roles);
  return known.length === 0 ? 'No role yet' : known.map((role) => ROLE_LABELS[role]).join(' · ');
}

/** Only same-site paths are followed after sign-in, never another origin. */
export function safeRedirectPath(candidate: string | null | undefined): string {
  if (!candidate || !candidate.startsWith('/') || candidate.startsWith('//') || candidate.startsWith('/\\')) {
    return OVERVIEW_PATH;
  }
  if (candidate.startsWith('/sign-in')) return OVERVIEW_PATH;
  return candidate;
}
