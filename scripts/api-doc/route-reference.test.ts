import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { routeTable } from '../../server/routes/route-table';
import { renderRouteReference } from './render-route-reference';

describe('docs/api-routes.md', () => {
  it('lists every route of the route table as it is now (run `npm run api:doc` after changing routes)', () => {
    const written = readFileSync(path.join(import.meta.dirname, '..', '..', 'docs', 'api-routes.md'), 'utf8');
    expect(written).toBe(renderRouteReference(routeTable));
    for (const route of routeTable) expect(written).toContain(`\`${route.method.toUpperCase()} ${route.path}\``);
  });
});
