/** `npm run api:doc`: rewrites docs/api-routes.md from the route table. */
import { writeFileSync } from 'node:fs';
import path from 'node:path';
import { routeTable } from '../../server/routes/route-table';
import { renderRouteReference } from './render-route-reference';

export const ROUTE_REFERENCE_PATH = path.join(import.meta.dirname, '..', '..', 'docs', 'api-routes.md');

writeFileSync(ROUTE_REFERENCE_PATH, renderRouteReference(routeTable));
process.stdout.write(`Wrote ${path.relative(process.cwd(), ROUTE_REFERENCE_PATH)} (${routeTable.length} routes).\n`);
