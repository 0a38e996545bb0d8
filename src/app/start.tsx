// The app itself: the router with every page, the query client and the theme. Loaded by main.tsx
// after it has started the first requests (earlyStart.ts).
import { QueryClientProvider } from '@tanstack/react-query';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { RouterProvider } from 'react-router/dom';
import { queryClient } from './queryClient.js';
import { createAppRouter } from './router.js';
import { watchTheme } from './theme/theme.js';

watchTheme();

// The router (which starts the first route's loaders) and the first render run in a task of their
// own, after this code's modules have run: together they held the page for a single task of
// 150-240 ms on the 2-core machine, the longest of a large workbook's open.
setTimeout(() => {
  const router = createAppRouter();
  createRoot(document.getElementById('root')!).render(
    <StrictMode>
      <QueryClientProvider client={queryClient}>
        <RouterProvider router={router} />
      </QueryClientProvider>
    </StrictMode>,
  );
}, 0);
