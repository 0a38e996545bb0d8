import type { ErrorRequestHandler, RequestHandler } from 'express';
import { z } from 'zod';
import { storageFailureOf, type StorageHealth } from './services/storageHealth.js';
import { SpreadsheetError } from './xlsx/limits.js';

// The one error path of the API. Services and middleware throw (HttpError, or SpreadsheetError from
// reading and computing spreadsheets); errorHandler below is the only place an error becomes a
// response: { error: { code, message, details? } } with its status. Bad input is always a 4xx;
// storage failures are 507/503 (services/storageHealth.ts); only a bug is a 500.

/** A refusal with its HTTP status and a stable code, thrown by services, middleware and routes. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
    /** Extra response headers, such as Retry-After on a 429. */
    readonly headers?: Record<string, string>,
  ) {
    super(message);
  }
}

export const badRequest = (message: string, details?: unknown) => new HttpError(400, 'bad_request', message, details);
export const unauthorized = (message = 'sign in first') => new HttpError(401, 'unauthorized', message);
export const forbidden = (message: string) => new HttpError(403, 'forbidden', message);
export const notFound = (what: string) => new HttpError(404, 'not_found', `${what} not found`);
export const conflict = (message: string, details?: unknown) => new HttpError(409, 'conflict', message, details);

/** Parses with zod; a failure becomes a 400 whose message names the field. */
export function parse<S extends z.ZodType>(schema: S, value: unknown, where = 'body'): z.infer<S> {
  const result = schema.safeParse(value);
  if (result.success) return result.data;
  const issues = result.error.issues.map((i) => ({ field: i.path.join('.') || where, message: i.message }));
  const first = issues[0];
  throw new HttpError(400, 'invalid_input', `${first.field}: ${first.message}`, { issues });
}

/**
 * A spreadsheet refusal as an answer. An uploaded file's fault keeps the status of its code (400 or
 * 413) and names the file; work on a stored workbook (values, exports) that hits a limit is the
 * server's, so 503 naming the limit, or 429 when the person already has too many jobs under way.
 */
export function spreadsheetRefusal(e: SpreadsheetError): HttpError {
  const subject = e.subject ?? 'file';
  if (subject === 'file') return new HttpError(e.status, e.code, `file: ${e.message}`);
  if (e.code === 'too_many_jobs') return new HttpError(429, 'too_many_jobs', `${subject}: ${e.message}`, undefined, { 'Retry-After': '5' });
  if (e.code === 'busy') return new HttpError(503, 'busy', `${subject}: ${e.message}`, undefined, { 'Retry-After': '30' });
  return new HttpError(503, `${subject}_failed`, `${subject}: ${e.message}${e.hint}`);
}

export const notFoundApi: RequestHandler = (req, _res, next) => next(new HttpError(404, 'not_found', `no API route ${req.method} ${req.path}`));

export const errorHandler: ErrorRequestHandler = (thrown, req, res, _next) => {
  const err = thrown instanceof SpreadsheetError ? spreadsheetRefusal(thrown) : thrown;
  if (err instanceof HttpError) {
    if (err.headers) res.set(err.headers);
    res.status(err.status).json({ error: { code: err.code, message: err.message, ...(err.details !== undefined ? { details: err.details } : {}) } });
    return;
  }
  // body-parser errors: malformed JSON, too large
  const status = typeof err?.status === 'number' ? err.status : typeof err?.statusCode === 'number' ? err.statusCode : 500;
  if (status === 400 && err?.type === 'entity.parse.failed') {
    res.status(400).json({ error: { code: 'invalid_json', message: 'body: not valid JSON' } });
    return;
  }
  if (status === 413) {
    res.status(413).json({ error: { code: 'too_large', message: `body: larger than the limit${err.limit ? ` of ${err.limit} bytes` : ''}` } });
    return;
  }
  if (status >= 400 && status < 500) {
    res.status(status).json({ error: { code: 'bad_request', message: String(err?.message ?? 'bad request') } });
    return;
  }
  // A full disk or an I/O error: say so (and let /api/health say so) rather than "internal error".
  const storage = (req.app?.locals?.storageHealth as StorageHealth | undefined)?.noteFailure(err) ?? storageFailureOf(err);
  if (storage) {
    (req as any).log?.error({ err }, 'storage failure');
    res.status(storage.status).json({ error: { code: storage.code, message: storage.message } });
    return;
  }
  (req as any).log?.error({ err }, 'unhandled error');
  if (!(req as any).log) console.error(err);
  res.status(500).json({ error: { code: 'internal', message: 'internal error; it has been logged' } });
};
