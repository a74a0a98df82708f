import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { vectorKeys } from '../../../lib/query-keys.ts';

export type ImportResult = { created: number; updated: number; unchanged: number; total: number };

export function importVectors(file: File): Promise<ImportResult> {
  const form = new FormData();
  form.set('file', file);
  return api.post<ImportResult>('/vectors/import', form);
}

export function useImportVectors() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: importVectors, onSuccess: () => queryClient.invalidateQueries({ queryKey: vectorKeys.all }) });
}
