import { createBrowserRouter } from 'react-router';
import type { QueryClient } from '@tanstack/react-query';
import { paths } from '../config/paths.ts';
import { redirectIfSignedIn, requireRole, requireSession } from './guards.ts';
import { RouteError } from './routes/route-error.tsx';

/**
 * Every page is a lazy route, so each arrives in its own chunk.
 * To add a page: a route module under src/features/<name>/routes/, one entry below, one line in nav.ts.
 */
export function createAppRouter(queryClient: QueryClient) {
  return createBrowserRouter([
    {
      id: 'signed-in',
      path: '/',
      loader: requireSession(queryClient),
      lazy: async () => ({ Component: (await import('./routes/app-layout.tsx')).AppLayout }),
      errorElement: <RouteError />,
      children: [
        {
          // Errors inside a page keep the shell (top bar and nav) around the message.
          errorElement: <RouteError />,
          children: [
            {
              index: true,
              lazy: async () => ({ Component: (await import('./routes/home.tsx')).HomeRoute }),
            },
            {
              path: paths.offers.path,
              lazy: async () => ({ Component: (await import('../features/offers/routes/offers.tsx')).OffersRoute }),
            },
            {
              path: paths.rules.index.path,
              lazy: async () => ({ Component: (await import('../features/rules/routes/rules-index.tsx')).RulesIndexRoute }),
            },
            {
              path: paths.rules.detail.path,
              lazy: async () => ({ Component: (await import('../features/rules/routes/rule-detail.tsx')).RuleDetailRoute }),
            },
            {
              path: paths.decoder.path,
              lazy: async () => ({ Component: (await import('../features/decoder/routes/decoder.tsx')).DecoderRoute }),
            },
            {
              path: paths.admin.users.path,
              loader: requireRole(queryClient, ['admin']),
              lazy: async () => ({ Component: (await import('../features/users/routes/users.tsx')).UsersRoute }),
            },
            {
              path: paths.admin.outbox.path,
              loader: requireRole(queryClient, ['admin']),
              lazy: async () => ({ Component: (await import('../features/outbox/routes/outbox.tsx')).OutboxRoute }),
            },
            {
              path: paths.admin.audit.path,
              loader: requireRole(queryClient, ['admin']),
              lazy: async () => ({ Component: (await import('../features/audit/routes/audit.tsx')).AuditRoute }),
            },
            {
              path: '*',
              lazy: async () => ({ Component: (await import('./routes/not-found.tsx')).NotFoundRoute }),
            },
          ],
        },
      ],
    },
    {
      id: 'public',
      lazy: async () => ({ Component: (await import('./routes/auth-layout.tsx')).AuthLayout }),
      errorElement: <RouteError />,
      children: [
        {
          path: paths.auth.signIn.path,
          loader: redirectIfSignedIn(queryClient),
          lazy: async () => ({ Component: (await import('../features/auth/routes/sign-in.tsx')).SignInRoute }),
        },
        {
          path: paths.auth.forgotPassword.path,
          lazy: async () => ({ Component: (await import('../features/auth/routes/forgot-password.tsx')).ForgotPasswordRoute }),
        },
        {
          path: paths.auth.resetPassword.path,
          lazy: async () => ({ Component: (await import('../features/auth/routes/reset-password.tsx')).ResetPasswordRoute }),
        },
        {
          path: paths.auth.acceptInvite.path,
          lazy: async () => ({ Component: (await import('../features/auth/routes/accept-invite.tsx')).AcceptInviteRoute }),
        },
      ],
    },
  ]);
}

export type AppRouter = ReturnType<typeof createAppRouter>;

/** Routes a signed-out visitor may see; a 401 there is not a reason to redirect. */
export const publicPathPrefixes = ['/sign-in', '/forgot-password', '/reset/', '/invite/'] as const;
