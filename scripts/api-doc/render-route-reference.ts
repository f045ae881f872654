import type { RouteSpec } from '../../server/routes/route-definition';

const ROLE_LETTERS: Record<string, string> = { technician: 'T', reviewer: 'R', client: 'C', admin: 'A' };

function who(roles: RouteSpec['roles']): string {
  if (roles === 'public') return 'anyone';
  if (roles === 'signed-in') return 'signed in';
  return roles.map((role) => ROLE_LETTERS[role] ?? role).join(' ');
}

/** The route reference as Markdown, grouped by the path's first segment after /api/. */
export function renderRouteReference(routes: readonly RouteSpec[]): string {
  const groups = new Map<string, RouteSpec[]>();
  for (const route of routes) {
    const group = route.path.split('/')[2] ?? '';
    groups.set(group, [...(groups.get(group) ?? []), route]);
  }
  const lines = [
    '# Route reference',
    '',
    'Generated from `server/routes/route-table.ts` by `npm run api:doc`; a test fails when it is out of date.',
    'Roles: T technician, R reviewer, C client, A admin. Every state-changing request needs the `x-csrf-token` header.',
    'Request and response shapes: [api-bench.md](api-bench.md) for the bench workflow, and the zod schemas in `shared/schemas/`.',
    '',
  ];
  for (const [group, members] of groups) {
    lines.push(`## ${group}`, '', '| route | who | what |', '| --- | --- | --- |');
    for (const route of members) {
      lines.push(`| \`${route.method.toUpperCase()} ${route.path}\` | ${who(route.roles)} | ${route.summary.replace(/\|/g, '\\|')} |`);
    }
    lines.push('');
  }
  return lines.join('\n');
}
