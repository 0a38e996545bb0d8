// A refusal from the worker pool as the API's error, for work on a workbook that is already stored
// (values, exports): then a failure is the server's limit, not a bad request, so it is a 503 naming
// the limit, a 429 when the person already has too much under way, never a 500.
import { HttpError } from '../errors.js';
import { SpreadsheetError } from './limits.js';

export function computeRefusal(what: 'values' | 'export', e: SpreadsheetError, hint = ''): HttpError {
  if (e.code === 'too_many_jobs') return new HttpError(429, 'too_many_jobs', `${what}: ${e.message}`, undefined, { 'Retry-After': '5' });
  if (e.code === 'busy') return new HttpError(503, 'busy', `${what}: ${e.message}`, undefined, { 'Retry-After': '30' });
  return new HttpError(503, `${what}_failed`, `${what}: ${e.message}${hint}`);
}
