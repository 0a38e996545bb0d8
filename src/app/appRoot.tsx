// The app itself: the router with every page and the query client, rendered into a root made by
// start.tsx. Its modules (the router, the request schemas, the query cache) run in a task of their own.
import { QueryClientProvider } from '@tanstack/react-query';
import { StrictMode } from 'react';
import type { Root } from 'react-dom/client';
import { RouterProvider } from 'react-router/dom';
import { queryClient } from './queryClient.js';
import { createAppRouter } from './router.js';

/** Makes the router (which starts the first route's loaders) and renders the app into `root`. */
export function renderApp(root: Root) {
  const router = createAppRouter();
  root.render(
    <StrictMode>
      <QueryClientProvider client={queryClient}>
        <RouterProvider router={router} />
      </QueryClientProvider>
    </StrictMode>,
  );
}
