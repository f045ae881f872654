import { describe, expect, it } from 'vitest';
import { chooseHome, describeRoles, hasAnyRole, navigationFor, rolesInWorkOrder, safeRedirectPath } from '@/lib/authorization';

describe('authorization', () => {
  it('rolesInWorkOrder orders roles as the work flows and drops unknown ones', () => {
    expect(rolesInWorkOrder(['admin', 'technician', 'auditor', 'technician'])).toEqual(['technician', 'admin']);
  });

  it('chooseHome sends a single-role person straight to that role’s page', () => {
    expect(chooseHome({ roles: ['client'] })).toEqual({
      kind: 'single',
      home: { role: 'client', path: '/orders', label: 'Orders and certificates', group: 'Your orders' },
    });
  });

  it('chooseHome combines the homes of a person with several roles, in work order', () => {
    const choice = chooseHome({ roles: ['reviewer', 'technician'] });
    expect(choice.kind).toBe('combined');
    expect(choice.kind === 'combined' && choice.homes.map((home) => home.path)).toEqual(['/bench', '/review']);
    expect(chooseHome({ roles: [] })).toEqual({ kind: 'no-role' });
  });

  it('navigationFor lists only the pages a person’s roles reach', () => {
    const client = navigationFor({ roles: ['client'] });
    expect(client.flatMap((group) => group.entries.map((entry) => entry.to))).toEqual(['/orders', '/orders/request', '/work-orders']);
    const labLead = navigationFor({ roles: ['admin', 'reviewer'] });
    expect(labLead.flatMap((group) => group.entries.map((entry) => entry.to))).toEqual([
      '/',
      '/review',
      '/system',
      '/admin/people',
      '/admin/organisations',
      '/admin/storage',
      '/admin/audit',
      '/admin/mail',
      '/work-orders',
      '/equipment',
    ]);
    expect(navigationFor({ roles: [] })).toEqual([]);
  });

  it('hasAnyRole and describeRoles read a person’s roles', () => {
    expect(hasAnyRole({ roles: ['technician'] }, ['admin'])).toBe(false);
    expect(hasAnyRole({ roles: ['technician', 'admin'] }, ['admin'])).toBe(true);
    expect(describeRoles(['reviewer', 'technician'])).toBe('Technician · Reviewer');
  });

  it('safeRedirectPath follows only same-site paths (common practice against open redirects)', () => {
    expect(safeRedirectPath('/review?tab=2')).toBe('/review?tab=2');
    expect(safeRedirectPath('//evil.example/')).toBe('/');
    expect(safeRedirectPath('/\\evil.example')).toBe('/');
    expect(safeRedirectPath('https://evil.example/')).toBe('/');
    expect(safeRedirectPath('/sign-in?redirectTo=/x')).toBe('/');
    expect(safeRedirectPath(null)).toBe('/');
  });
});
