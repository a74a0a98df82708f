/**
 * Every client route in one map: `path` for the router, `getHref` for links.
 * Invite and reset links in e-mails use `/invite/:token` and `/reset/:token`; keep them.
 */
export const paths = {
  home: {
    path: '/',
    getHref: () => '/',
  },
  offers: {
    path: '/offers',
    getHref: () => '/offers',
  },
  rules: {
    index: {
      path: '/rules',
      getHref: () => '/rules',
    },
    detail: {
      path: '/rules/:ruleId',
      getHref: (ruleId: string) => `/rules/${encodeURIComponent(ruleId)}`,
    },
  },
  auth: {
    signIn: {
      path: '/sign-in',
      /** `next` is where to return after signing in (a path on this site). */
      getHref: (next?: string | null) => (next && next !== '/' ? `/sign-in?next=${encodeURIComponent(next)}` : '/sign-in'),
    },
    forgotPassword: {
      path: '/forgot-password',
      getHref: () => '/forgot-password',
    },
    resetPassword: {
      path: '/reset/:token',
      getHref: (token: string) => `/reset/${encodeURIComponent(token)}`,
    },
    acceptInvite: {
      path: '/invite/:token',
      getHref: (token: string) => `/invite/${encodeURIComponent(token)}`,
    },
  },
  properties: {
    path: '/properties',
    getHref: () => '/properties',
  },
  decoder: {
    path: '/decoder',
    /** `search` is the decoder's input as URL search params (see features/decoder/lib/search-params.ts). */
    getHref: (search?: string) => (search ? `/decoder?${search}` : '/decoder'),
  },
  bench: {
    path: '/bench',
    /** `fromTrace` opens a stored trace as a scenario (GET /api/traces/:id). */
    getHref: (options?: { fromTrace?: string | number }) => (options?.fromTrace !== undefined ? `/bench?fromTrace=${encodeURIComponent(String(options.fromTrace))}` : '/bench'),
  },
  sweep: {
    path: '/sweep',
    getHref: () => '/sweep',
  },
  traces: {
    index: {
      path: '/traces',
      /** `search`: the list's filters as URL search params (q, deviceId, severity, uploaderId, sort, page). */
      getHref: (search?: string) => (search ? `/traces?${search}` : '/traces'),
    },
    detail: {
      path: '/traces/:traceId',
      /** `finding`: the index of a finding to open the timeline at. */
      getHref: (traceId: string | number, finding?: number) => `/traces/${encodeURIComponent(String(traceId))}${finding === undefined ? '' : `?finding=${finding}`}`,
    },
    shared: {
      path: '/shared/reports/:token',
      getHref: (token: string) => `/shared/reports/${encodeURIComponent(token)}`,
    },
    report: {
      path: '/traces/:traceId/report',
      getHref: (traceId: string | number) => `/traces/${encodeURIComponent(String(traceId))}/report`,
    },
  },
  library: {
    index: {
      path: '/library',
      getHref: () => '/library',
    },
    create: {
      path: '/library/new',
      getHref: () => '/library/new',
    },
    vector: {
      /** The vector id URL-encoded (`/` as %2F); a splat, so an unencoded id opens too. */
      path: '/library/*',
      getHref: (vectorId: string) => `/library/${encodeURIComponent(vectorId)}`,
    },
  },
  runs: {
    index: {
      path: '/runs',
      getHref: (project?: string) => (project ? `/runs?project=${encodeURIComponent(project)}` : '/runs'),
    },
    detail: {
      path: '/runs/:runId',
      getHref: (runId: number | string, vectorId?: string) => `/runs/${encodeURIComponent(String(runId))}${vectorId ? `?result=${encodeURIComponent(vectorId)}` : ''}`,
    },
  },
  admin: {
    tokens: {
      path: '/admin/tokens',
      getHref: () => '/admin/tokens',
    },
    users: {
      path: '/admin/users',
      getHref: () => '/admin/users',
    },
    outbox: {
      path: '/admin/outbox',
      getHref: (mailId?: string | number) => (mailId === undefined ? '/admin/outbox' : `/admin/outbox?mail=${encodeURIComponent(String(mailId))}`),
    },
    audit: {
      path: '/admin/audit',
      getHref: (page?: number) => (page && page > 1 ? `/admin/audit?page=${page}` : '/admin/audit'),
    },
  },
} as const;

/** A return path is honoured only when it stays on this site (no `//host` or absolute URL). */
export function safeReturnPath(next: string | null | undefined): string {
  if (!next?.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return paths.home.getHref();
  if (next.startsWith(paths.auth.signIn.path)) return paths.home.getHref();
  return next;
}
