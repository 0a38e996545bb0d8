import { useLayoutEffect } from 'react';
import { isRouteErrorResponse, Link, useRouteError } from 'react-router';
import { Button } from '../components/ui/Button.js';
import { Notice } from '../components/ui/Notice.js';
import { sentence } from '../lib/fieldErrors.js';
import { endEarlyGlance } from './earlyGlance.js';

/** Shown when a page fails to load or render; says what failed and offers a way on. */
export function RouteError() {
  const error = useRouteError();
  useLayoutEffect(endEarlyGlance, []);
  const message = isRouteErrorResponse(error)
    ? `${error.status} ${error.statusText}`
    : error instanceof TypeError && /dynamically imported module|Failed to fetch/i.test(error.message)
      ? 'Could not load this part of the app. The server may be down, or Orbitab was updated: reload the page.'
      : error instanceof Error
        ? sentence(error.message)
        : 'Unknown error.';
  return (
    <div className="mx-auto max-w-xl px-6 py-10">
      <title>Error · Orbitab</title>
      <Notice tone="error" title="Something went wrong">
        {message}
      </Notice>
      <div className="mt-3 flex gap-2">
        <Button variant="primary" onClick={() => window.location.reload()}>
          Reload
        </Button>
        <Link to="/" className="inline-flex h-7 items-center rounded-ctl px-2.5 text-ui font-medium text-accent hover:bg-hover">
          Go to workbooks
        </Link>
      </div>
    </div>
  );
}

export function NotFoundPage() {
  return (
    <div className="mx-auto max-w-xl px-6 py-10">
      <title>Not found · Orbitab</title>
      <h1 className="text-heading font-semibold">Nothing here</h1>
      <p className="mt-1 text-ink-2">This address is not a page of Orbitab.</p>
      <Link to="/" className="mt-3 inline-block font-medium text-accent hover:underline">
        Go to workbooks
      </Link>
    </div>
  );
}
