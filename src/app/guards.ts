// Route loaders that decide who may see a page. The user comes from the one `me` query, so a
// guard costs a request only when the app starts or after sign-in/out changed it.
import { redirect, type LoaderFunctionArgs } from 'react-router';
import { meQueryOptions } from '../core/session/me.js';
import { safeNext } from '../features/auth/safeNext.js';
import { queryClient } from './queryClient.js';

export function signInPath(pathname: string, search = ''): string {
  const here = pathname + search;
  return here === '/' ? '/sign-in' : `/sign-in?next=${encodeURIComponent(here)}`;
}

/** Signed-out visitors go to sign-in, remembering where they were heading. */
export async function requireSignedIn({ request }: LoaderFunctionArgs) {
  const user = await queryClient.ensureQueryData(meQueryOptions);
  if (!user) {
    const url = new URL(request.url);
    throw redirect(signInPath(url.pathname, url.search));
  }
  return null;
}

/** Someone already signed in has no business on the sign-in or sign-up form. */
export async function redirectIfSignedIn({ request }: LoaderFunctionArgs) {
  const user = await queryClient.ensureQueryData(meQueryOptions);
  if (user) throw redirect(safeNext(new URL(request.url).searchParams));
  return null;
}
