/**
 * Import mappings: how a team's console logs are read (time column and unit, direction words, hex
 * bytes or words). Everyone signed in may list them (the upload panel offers them); the roles that
 * upload traces may save and delete them.
 */
import { UniqueConstraintViolationException } from '@mikro-orm/core';
import { z } from 'zod';
import { textMappingSchema } from '../../../shared/trace/mapped-text-reader.ts';
import { conflict, forbidden, notFound } from '../../errors.ts';
import { currentUser, route, type RouteDef } from '../../route-def.ts';
import { ImportMapping, type IImportMapping } from './entity.ts';

const writers = ['admin', 'engineer', 'qa', 'support'] as const;
const idParams = z.object({ id: z.coerce.number().int().positive() });
export const MAX_IMPORT_MAPPINGS = 200;

function present(row: IImportMapping) {
  return { id: row.id, name: row.name, mapping: row.mapping, createdBy: { id: row.createdById, name: row.createdByName }, createdAt: row.createdAt.toISOString() };
}

export const importMappingRoutes: RouteDef[] = [
  route({
    method: 'get',
    path: '/api/import-mappings',
    access: 'signed-in',
    async handler({ em }) {
      const rows = await em.find(ImportMapping, {}, { orderBy: { name: 'asc' }, limit: MAX_IMPORT_MAPPINGS });
      return { items: rows.map(present) };
    },
  }),
  route({
    method: 'post',
    path: '/api/import-mappings',
    access: writers,
    body: textMappingSchema,
    async handler(ctx) {
      const { em, body, res, deps } = ctx;
      const me = currentUser(ctx);
      if ((await em.count(ImportMapping, {})) >= MAX_IMPORT_MAPPINGS) throw conflict(`A team keeps at most ${MAX_IMPORT_MAPPINGS} mappings; delete one first`, 'import-mapping.too-many');
      const row = em.create(ImportMapping, { name: body.name, mapping: body as unknown as Record<string, unknown>, createdById: me.id, createdByName: me.name, createdAt: deps.clock.now() });
      try {
        await em.flush();
      } catch (error) {
        if (error instanceof UniqueConstraintViolationException) throw conflict(`A mapping called "${body.name}" exists already`, 'import-mapping.name-taken');
        throw error;
      }
      res.status(201);
      return present(row);
    },
  }),
  route({
    method: 'delete',
    path: '/api/import-mappings/:id',
    access: writers,
    params: idParams,
    async handler(ctx) {
      const { em, params } = ctx;
      const me = currentUser(ctx);
      const row = await em.findOne(ImportMapping, { id: params.id });
      if (!row) throw notFound('No such import mapping', 'import-mapping.not-found');
      if (me.role !== 'admin' && row.createdById !== me.id) throw forbidden('Only the person who saved a mapping, or an admin, may delete it', 'import-mapping.not-yours');
      await em.remove(row).flush();
      return undefined;
    },
  }),
];
