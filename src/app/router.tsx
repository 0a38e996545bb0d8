// Every route of the app, in React Router's data mode. Pages that pull in heavy code (the grid with
// its formula engine, the function reference with the catalog) load on first visit.
import { createBrowserRouter } from 'react-router';
import { AdminUsersPage } from '../features/admin/AdminUsersPage.js';
import { MailOutbox } from '../features/admin/MailOutbox.js';
import { SignInPage } from '../features/auth/SignInPage.js';
import { SignUpPage } from '../features/auth/SignUpPage.js';
import { AccountPage } from '../features/auth/AccountPage.js';
import { ForgotPasswordPage, ResetPasswordPage } from '../features/auth/PasswordResetPages.js';
import { VerifyEmailPage } from '../features/auth/VerifyEmailPage.js';
import { InvitationPage } from '../features/sharing/InvitationPage.js';
import { ImportButton } from '../features/io/index.js';
import { WorkbookListPage } from '../features/workbooks/WorkbookListPage.js';
import { redirectIfSignedIn, requireSignedIn, signInPath } from './guards.js';
import { AppLayout } from './layout/AppLayout.js';
import { onSessionLost, queryClient } from './queryClient.js';
import { meQueryOptions } from '../core/session/me.js';
import { startWorkbookLoad, storedValuesQueryOptions } from '../core/workbook/api.js';
import { loadOpenchemlib } from '@functions/chem/openchemlib.js';
import { NotFoundPage, RouteError } from './RouteError.js';
import { endEarlyGlance } from './earlyGlance.js';

/** The app's router; made when the app starts (start.tsx), which also starts the first route's loaders. */
export function createAppRouter() {
  const router = createBrowserRouter([
    {
      // Shown while the first guard asks the server who is signed in.
      HydrateFallback: () => <div className="h-screen bg-canvas" aria-busy="true" />,
      ErrorBoundary: RouteError,
      children: [
        { path: '/sign-in', loader: redirectIfSignedIn, Component: SignInPage },
        { path: '/sign-up', loader: redirectIfSignedIn, Component: SignUpPage },
        // Open signed out too: an invitee reads who invited them before signing up or in.
        { path: '/invitations/:token', Component: InvitationPage },
        // Links from e-mail: they work signed in or out (the token is what counts).
        { path: '/verify-email/:token', Component: VerifyEmailPage },
        { path: '/forgot-password', Component: ForgotPasswordPage },
        { path: '/reset-password/:token', Component: ResetPasswordPage },
        {
          loader: requireSignedIn,
          Component: AppLayout,
          ErrorBoundary: RouteError,
          children: [
            { index: true, Component: () => <WorkbookListPage importControl={<ImportButton label="Import file…" />} /> },
            {
              path: 'workbooks/:id',
              // The workbook starts loading while the page's code downloads (for a signed-in visitor only),
              // and so does the structure toolkit, which runs as a task of its own rather than inside the
              // page's start-up script (the engine waits for it: useWorkbookSession) — unless the
              // workbook's values are stored: then its first screen is drawn from them first, and the
              // session asks for the toolkit once they are painted.
              loader: ({ params }) => {
                const id = params.id;
                const toolkit = () => void loadOpenchemlib().catch(() => undefined);
                void queryClient.ensureQueryData(meQueryOptions).then((user) => {
                  if (!user || !id) return toolkit();
                  startWorkbookLoad(queryClient, id);
                  void queryClient.ensureQueryData(storedValuesQueryOptions(id)).then((stored) => !stored && toolkit(), toolkit);
                }, toolkit);
                return null;
              },
              lazy: async () => ({ Component: (await import('./workbook/WorkbookPage.js')).WorkbookPage }),
            },
            {
              path: 'functions',
              lazy: async () => ({ Component: (await import('../features/reference/FunctionReferencePage.js')).FunctionReferencePage }),
            },
            { path: 'account', Component: AccountPage },
            { path: 'admin', Component: AdminUsersPage },
            { path: 'admin/mail', Component: MailOutbox },
            { path: '*', Component: NotFoundPage },
          ],
        },
      ],
    },
  ]);
  // The first rows the page's first script drew (earlyGlance.ts) belong to the address it started on.
  const startedOn = router.state.location.pathname;
  const stopGlance = router.subscribe((state) => {
    if (state.location.pathname === startedOn && !state.errors) return;
    endEarlyGlance();
    stopGlance();
  });
  // When the server says the session is gone (401 on any call), go to sign-in and come back after.
  onSessionLost(() => {
    const { pathname, search } = router.state.location;
    if (pathname === '/sign-in' || pathname === '/sign-up' || pathname === '/forgot-password' || /^\/(reset-password|verify-email)\//.test(pathname)) return;
    void router.navigate(signInPath(pathname, search), { replace: true });
  });
  return router;
}
