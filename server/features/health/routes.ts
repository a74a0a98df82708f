import { route, type RouteDef } from '../../route-def.ts';

export const healthRoutes: RouteDef[] = [
  route({
    method: 'get',
    path: '/api/health',
    access: 'anyone',
    async handler({ em }) {
      // A trivial query proves the database answers; the app is built only after migrations ran.
      await em.getConnection().execute('select 1');
      return { ok: true };
    },
  }),
];
