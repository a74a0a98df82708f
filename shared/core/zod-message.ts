/**
 * The one "field: message" sentence of a failed zod parse, for every edge (server, CLI, worker,
 * forms). Typed by shape rather than by zod, so the core stays free of packages.
 */
export interface IssueLike {
  path: readonly PropertyKey[];
  message: string;
}

export interface ZodMessageOptions {
  /** Names the input when an issue's path is empty (`body`, `scenario`, `(file)`). */
  where?: string;
  /** Put before every path, for input nested in a larger one (`offers` → `offers.0.voltageMv`). */
  prefix?: string;
  /** Show at most this many issues, then "(and N more)". */
  limit?: number;
}

/** `a.0.b` for a path; the prefix, else `where`, for an empty one. */
export function fieldOf(path: readonly PropertyKey[], { where = 'input', prefix }: ZodMessageOptions = {}): string {
  const dotted = path.map(String).join('.');
  if (dotted === '') return prefix ?? where;
  return prefix ? `${prefix}.${dotted}` : dotted;
}

/** "field: message; field: message (and 2 more)". */
export function zodMessage(error: { issues: readonly IssueLike[] }, options: ZodMessageOptions = {}): string {
  const limit = options.limit ?? error.issues.length;
  const shown = error.issues.slice(0, limit).map((issue) => `${fieldOf(issue.path, options)}: ${issue.message}`);
  if (shown.length === 0) return `${options.prefix ?? options.where ?? 'input'}: invalid`;
  const more = error.issues.length > limit ? ` (and ${error.issues.length - limit} more)` : '';
  return shown.join('; ') + more;
}
