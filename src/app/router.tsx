import { createBrowserRouter } from 'react-router';
import type { QueryClient } from '@tanstack/react-query';
import { paths } from '../config/paths.ts';
import { redirectIfSignedIn, requireRole, requireSession } from './guards.ts';
import { RouteError } from './routes/route-error.tsx';
import { roleGroups } from '../lib/roles.ts';
import { prefetchTracePage } from '../features/traces/api/prefetch-trace-page.ts';

/** Shown while a route's code and first data arrive (the router's hydrate fallback). */
function PageLoading() {
  return (
    <p className="p-8 text-xs text-slate-500" role="status">
      Loading…
    </p>
  );
}

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
      hydrateFallbackElement: <PageLoading />,
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
              path: paths.bench.path,
              lazy: async () => ({ Component: (await import('../features/bench/routes/bench.tsx')).BenchRoute }),
            },
            {
              path: paths.sweep.path,
              lazy: async () => ({ Component: (await import('../features/sweep/routes/fault-sweep.tsx')).FaultSweepRoute }),
            },
            {
              path: paths.traces.index.path,
              lazy: async () => ({ Component: (await import('../features/traces/routes/traces.tsx')).TracesRoute }),
            },
            {
              path: paths.traces.detail.path,
              // What the page draws from is asked for now, beside its code and the session check.
              loader: ({ params, request }) => {
                prefetchTracePage(queryClient, params.traceId ?? '', new URL(request.url).searchParams);
                return null;
              },
              // The page keeps its zoom in the URL; a new window is its own read, not a new navigation's.
              shouldRevalidate: ({ currentParams, nextParams }) => currentParams.traceId !== nextParams.traceId,
              lazy: async () => ({ Component: (await import('../features/traces/routes/trace.tsx')).TraceRoute }),
            },
            {
              path: paths.properties.path,
              loader: requireRole(queryClient, roleGroups.editors),
              lazy: async () => ({ Component: (await import('../features/properties/routes/properties.tsx')).PropertiesRoute }),
            },
            {
              path: paths.library.index.path,
              lazy: async () => ({ Component: (await import('../features/library/routes/library.tsx')).LibraryRoute }),
            },
            {
              path: paths.library.create.path,
              loader: requireRole(queryClient, roleGroups.editors),
              lazy: async () => ({ Component: (await import('../features/library/routes/vector.tsx')).NewVectorRoute }),
            },
            {
              path: paths.library.vector.path,
              lazy: async () => ({ Component: (await import('../features/library/routes/vector.tsx')).VectorRoute }),
            },
            {
              path: paths.runs.index.path,
              lazy: async () => ({ Component: (await import('../features/runs/routes/runs.tsx')).RunsRoute }),
            },
            {
              path: paths.runs.detail.path,
              lazy: async () => ({ Component: (await import('../features/runs/routes/run-detail.tsx')).RunDetailRoute }),
            },
            {
              path: paths.admin.tokens.path,
              loader: requireRole(queryClient, roleGroups.admins),
              lazy: async () => ({ Component: (await import('../features/tokens/routes/tokens.tsx')).TokensRoute }),
            },
            {
              path: paths.admin.users.path,
              loader: requireRole(queryClient, roleGroups.admins),
              lazy: async () => ({ Component: (await import('../features/users/routes/users.tsx')).UsersRoute }),
            },
            {
              path: paths.admin.outbox.path,
              loader: requireRole(queryClient, roleGroups.admins),
              lazy: async () => ({ Component: (await import('../features/outbox/routes/outbox.tsx')).OutboxRoute }),
            },
            {
              path: paths.admin.audit.path,
              loader: requireRole(queryClient, roleGroups.admins),
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
      // The printable report stands outside the app shell: nothing but the report on paper.
      path: paths.traces.report.path,
      loader: requireSession(queryClient),
      lazy: async () => ({ Component: (await import('../features/traces/routes/trace-report.tsx')).TraceReportRoute }),
      errorElement: <RouteError />,
      hydrateFallbackElement: <PageLoading />,
    },
    {
      // A report opened by its read-only link: no session, no shell.
      path: paths.traces.shared.path,
      lazy: async () => ({ Component: (await import('../features/traces/routes/shared-report.tsx')).SharedReportRoute }),
      errorElement: <RouteError />,
      hydrateFallbackElement: <PageLoading />,
    },
    {
      id: 'public',
      lazy: async () => ({ Component: (await import('./routes/auth-layout.tsx')).AuthLayout }),
      errorElement: <RouteError />,
      hydrateFallbackElement: <PageLoading />,
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
export const publicPathPrefixes = ['/sign-in', '/forgot-password', '/reset/', '/invite/', '/shared/'] as const;
