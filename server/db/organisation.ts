import type { EntityManager } from '@mikro-orm/better-sqlite';
import { Organisation, type IOrganisation } from './entities.ts';

/** The organisation this server belongs to (one per installation; the first row). */
export async function findOrganisation(em: EntityManager): Promise<IOrganisation | null> {
  const [first] = await em.find(Organisation, {}, { orderBy: { id: 'asc' }, limit: 1 });
  return first ?? null;
}
