/** Where to go after signing in: the `next` the guard recorded, if it is a path on this site. */
export function safeNext(search: URLSearchParams): string {
  const next = search.get('next');
  // Only same-site paths: "//evil.example" and "https://…" would leave the app (open redirect).
  return next && next.startsWith('/') && !next.startsWith('//') && !next.startsWith('/\\') ? next : '/';
}
