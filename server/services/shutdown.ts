// The process is stopping (SIGTERM/SIGINT, server/main.ts): long work in flight (an import being
// stored) asks between its steps and answers 503 instead of being cut off mid-way.
import { HttpError } from '../errors.js';

let stopping = false;

export function beginShutdown(): void {
  stopping = true;
}

/** The refusal to answer with once the server is stopping, or null while it runs. */
export function shutdownRefusal(): HttpError | null {
  return stopping ? new HttpError(503, 'shutting_down', 'the server is restarting, so nothing was stored; send the file again in a minute', undefined, { 'Retry-After': '30' }) : null;
}
