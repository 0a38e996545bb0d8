// Starts the app. Loaded by main.tsx after it has started the first requests (earlyStart.ts).
// The app's code is run in steps, each a task of its own: React's renderer (react-dom/client), the
// router library, the request schemas, then the app's modules (appRoot.tsx: every page's static
// part), then the router and the first render. Run as one, the modules alone held the page for
// 180-340 ms on the 2-core machine, the longest task of a large workbook's open
// (bench/browser-open.ts).
import { watchTheme } from './theme/theme.js';

watchTheme();

const nextTask = () => new Promise<void>((resolve) => setTimeout(resolve, 0));

void (async () => {
  const { createRoot } = await import('react-dom/client');
  await nextTask();
  await import('react-router/dom');
  await nextTask();
  // The request and answer schemas (zod), built as their modules run.
  await import('@shared/workbooks.js');
  await nextTask();
  const { renderApp } = await import('./appRoot.js');
  await nextTask();
  renderApp(createRoot(document.getElementById('root')!));
})();
