import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { TextMapping, TextMappingInput } from '../../../../shared/trace/mapped-text-reader.ts';
import { api } from '../../../lib/api-client.ts';
import { createQueryKeys } from '../../../lib/query-keys.ts';

/** A saved mapping as the server presents it (server/features/import-mappings/routes.ts). */
export type SavedImportMapping = { id: number; name: string; mapping: TextMapping; createdBy: { id: number; name: string }; createdAt: string };

export const importMappingKeys = createQueryKeys('import-mappings');

export function importMappingsQueryOptions() {
  return queryOptions({ queryKey: importMappingKeys.lists(), queryFn: ({ signal }) => api.get<{ items: SavedImportMapping[] }>('/import-mappings', { signal }) });
}

export function useImportMappings() {
  return useQuery(importMappingsQueryOptions());
}

export function useSaveImportMapping() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (mapping: TextMappingInput) => api.post<SavedImportMapping>('/import-mappings', mapping),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: importMappingKeys.all }),
  });
}
