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
