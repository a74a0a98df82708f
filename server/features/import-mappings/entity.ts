import { defineEntity, type InferEntity } from '@mikro-orm/core';

/** A team's saved import mapping for line-oriented logs (shared/trace/mapped-text-reader.ts), chosen on upload. */
export const ImportMapping = defineEntity({
  name: 'ImportMapping',
  properties: (p) => ({
    id: p.integer().primary(),
    name: p.string().unique(),
    mapping: p.json<Record<string, unknown>>(),
    createdById: p.integer(),
    createdByName: p.string(),
    createdAt: p.datetime(),
  }),
});
export type IImportMapping = InferEntity<typeof ImportMapping>;
