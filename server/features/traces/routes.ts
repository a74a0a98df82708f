/** Every route of the Traces product, by seam: adding, listing, reading, progress, files, discussion. */
import type { RouteDef } from '../../route-def.ts';
import { discussionRoutes } from './discussion-routes.ts';
import { exportRoutes } from './export-routes.ts';
import { listRoutes } from './list-routes.ts';
import { progressRoutes } from './progress-routes.ts';
import { uploadRoutes } from './upload-routes.ts';
import { viewRoutes } from './view-routes.ts';

export const tracesRoutes: RouteDef[] = [...uploadRoutes, ...listRoutes, ...viewRoutes, ...progressRoutes, ...exportRoutes, ...discussionRoutes];
