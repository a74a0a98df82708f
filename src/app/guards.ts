import { data, redirect, type LoaderFunctionArgs } from 'react-router';
import type { QueryClient } from '@tanstack/react-query';
import { paths, safeReturnPath } from '../config/paths.ts';
import { meQueryOptions } from '../lib/auth.ts';
import type { Role } from '../lib/roles.ts';

function returnPathOf(request: Request): string {
  const url = new URL(request.url);
  return url.pathname + url.search;
}

/** Loader for the signed-in layout: signed-out visitors go to sign-in and come back afterwards. */
export function requireSession(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    const session = await queryClient.ensureQueryData(meQueryOptions());
    if (!session) throw redirect(paths.auth.signIn.getHref(returnPathOf(request)));
    return null;
  };
}

/** Loader for a page limited to some roles (the API checks the same roles). */
export function requireRole(queryClient: QueryClient, allowed: readonly Role[]) {
  return async ({ request }: LoaderFunctionArgs) => {
    const session = await queryClient.ensureQueryData(meQueryOptions());
    if (!session) throw redirect(paths.auth.signIn.getHref(returnPathOf(request)));
    if (!allowed.includes(session.user.role)) {
      throw data('This page is not available to your role.', { status: 403 });
    }
    return null;
  };
}

/** Loader for the sign-in page: someone already signed in goes straight on. */
export function redirectIfSignedIn(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    const session = await queryClient.ensureQueryData(meQueryOptions());
    if (session) throw redirect(safeReturnPath(new URL(request.url).searchParams.get('next')));
    return null;
  };
}
