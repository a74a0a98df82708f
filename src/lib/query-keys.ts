/**
 * Query keys for one resource, shaped all / lists / list / detail so a mutation can invalidate
 * exactly the lists (`keys.lists()`) or everything (`keys.all`) of that resource.
 */
export function createQueryKeys<const TName extends string>(name: TName) {
  const all = [name] as const;
  return {
    all,
    lists: () => [...all, 'list'] as const,
    list: <TParams extends object>(params?: TParams) => [...all, 'list', params ?? {}] as const,
    details: () => [...all, 'detail'] as const,
    detail: (id: string | number) => [...all, 'detail', String(id)] as const,
  };
}

/**
 * Every resource's keys, made here once: two features that read one endpoint share its cache,
 * and a mutation in one feature refreshes what another shows.
 */
export const auditKeys = createQueryKeys('audit');
export const deviceKeys = createQueryKeys('devices');
export const outboxKeys = createQueryKeys('outbox');
export const propertyQueueKeys = createQueryKeys('property-queue');
export const runKeys = createQueryKeys('runs');
export const tokenKeys = createQueryKeys('tokens');
export const traceKeys = createQueryKeys('traces');
export const userKeys = createQueryKeys('users');
export const vectorKeys = createQueryKeys('vectors');
