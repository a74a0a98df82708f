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
      getHref: (next?: string | null) =>
        next && next !== '/' ? `/sign-in?next=${encodeURIComponent(next)}` : '/sign-in',
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
  decoder: {
    path: '/decoder',
    /** `search` is the decoder's input as URL search params (see features/decoder/lib/search-params.ts). */
    getHref: (search?: string) => (search ? `/decoder?${search}` : '/decoder'),
  },
  admin: {
    users: {
      path: '/admin/users',
      getHref: () => '/admin/users',
    },
    outbox: {
      path: '/admin/outbox',
      getHref: (mailId?: string | number) =>
        mailId === undefined ? '/admin/outbox' : `/admin/outbox?mail=${encodeURIComponent(String(mailId))}`,
    },
    audit: {
      path: '/admin/audit',
      getHref: (page?: number) => (page && page > 1 ? `/admin/audit?page=${page}` : '/admin/audit'),
    },
  },
} as const;

/** A return path is honoured only when it stays on this site (no `//host` or absolute URL). */
export function safeReturnPath(next: string | null | undefined): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return paths.home.getHref();
  if (next.startsWith(paths.auth.signIn.path)) return paths.home.getHref();
  return next;
}
