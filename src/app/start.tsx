// The app itself: the router with every page, the query client and the theme. Loaded by main.tsx
// after it has started the first requests (earlyStart.ts).
import { QueryClientProvider } from '@tanstack/react-query';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { RouterProvider } from 'react-router/dom';
import { queryClient } from './queryClient.js';
import { router } from './router.js';
import { watchTheme } from './theme/theme.js';

watchTheme();

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>
  </StrictMode>,
);
