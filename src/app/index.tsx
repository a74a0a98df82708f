import { useState } from 'react';
import { QueryClientProvider } from '@tanstack/react-query';
import { RouterProvider } from 'react-router';
import { ErrorBoundary } from '../components/error-boundary.tsx';
import { paths } from '../config/paths.ts';
import { setUnauthorizedHandler } from '../lib/api-client.ts';
import { createQueryClient } from '../lib/query-client.ts';
import { createAppRouter, publicPathPrefixes } from './router.tsx';
import { AppCrashed } from './routes/app-crashed.tsx';

function createApp() {
  const queryClient = createQueryClient();
  const router = createAppRouter(queryClient);
  // A 401 from any call means the session has ended: back to sign-in, then back here.
  setUnauthorizedHandler(() => {
    const { pathname, search } = router.state.location;
    if (publicPathPrefixes.some((prefix) => pathname.startsWith(prefix))) return;
    queryClient.clear();
    void router.navigate(paths.auth.signIn.getHref(pathname + search), { replace: true });
  });
  return { queryClient, router };
}

export function App() {
  const [{ queryClient, router }] = useState(createApp);
  return (
    <ErrorBoundary fallback={() => <AppCrashed />}>
      <QueryClientProvider client={queryClient}>
        <RouterProvider router={router} />
      </QueryClientProvider>
    </ErrorBoundary>
  );
}
