/**
 * The list pages' state in the URL (page, selected row, filters), so a link, a reload or Back
 * shows the same list. Pure helpers; `useListParams` in use-list-params.ts binds them to the router.
 */

/** A copy of `params` with `changes` applied; a null or empty value removes its key. */
export function withParams(params: URLSearchParams, changes: Record<string, string | null>): URLSearchParams {
  const next = new URLSearchParams(params);
  for (const [key, value] of Object.entries(changes)) {
    if (value === null || value === '') next.delete(key);
    else next.set(key, value);
  }
  return next;
}

/** The page number in the URL, counting from 1; anything else reads as the first page. */
export function pageOf(params: URLSearchParams): number {
  return Math.max(1, Math.floor(Number(params.get('page'))) || 1);
}

/** A table's page index (from 0) as the URL's `page` value; the first page leaves the key out. */
export function pageParam(pageIndex: number): string | null {
  return pageIndex > 0 ? String(pageIndex + 1) : null;
}
