import { useSearchParams } from 'react-router';
import { pageOf, withParams } from './list-params.ts';

/** The URL's list state: the page (from 1), the row selected under `selectionKey`, and `update(changes)`. */
export function useListParams(selectionKey: string) {
  const [params, setParams] = useSearchParams();
  return {
    params,
    page: pageOf(params),
    selectedId: params.get(selectionKey),
    update: (changes: Record<string, string | null>) => setParams(withParams(params, changes)),
  };
}
