// Worker threads do not inherit the TypeScript loader of the main thread (tsx), in development, in
// tests or in production (`tsx server/main.ts`), so each parse worker registers it before loading
// its TypeScript entry.
import { workerData } from 'node:worker_threads';
import { register } from 'tsx/esm/api';

register();
await import(workerData.entry);
