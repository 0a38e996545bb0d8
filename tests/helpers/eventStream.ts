// A test client for Server-Sent Events: the app listens on a free port, fetch() reads the stream and
// the frames are parsed as the WHATWG HTML spec describes (event/data/id fields, ':' comments).
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import type { Express } from 'express';
import { testOrigin } from './app.js';

export interface StreamEvent {
  event: string;
  data: any;
  id?: string;
  /** performance.now() when the frame arrived. */
  at: number;
}

export interface EventStreamClient {
  status: number;
  contentType: string | null;
  events: StreamEvent[];
  comments: string[];
  /** Resolves with the first event (already received or still to come) that matches; rejects after timeoutMs. */
  next(match: (e: StreamEvent) => boolean, timeoutMs?: number): Promise<StreamEvent>;
  /** Resolves when the server ends the stream. */
  ended: Promise<void>;
  close(): void;
}

export async function listen(app: Express): Promise<{ url: string; close(): Promise<void> }> {
  const server = http.createServer(app);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}`,
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}

export async function openEventStream(url: string, headers: Record<string, string> = {}): Promise<EventStreamClient> {
  const abort = new AbortController();
  const res = await fetch(url, { headers: { Accept: 'text/event-stream', Origin: testOrigin, ...headers }, signal: abort.signal });
  const events: StreamEvent[] = [];
  const comments: string[] = [];
  const waiters = new Set<() => void>();
  let endedResolve!: () => void;
  const ended = new Promise<void>((r) => (endedResolve = r));

  const onFrame = (frame: string) => {
    const fields: Record<string, string> = {};
    for (const line of frame.split('\n')) {
      if (line.startsWith(':')) comments.push(line.slice(1).trim());
      else if (line.includes(':')) {
        const [name, ...rest] = line.split(':');
        const value = rest.join(':').replace(/^ /, '');
        fields[name] = name === 'data' && fields.data !== undefined ? `${fields.data}\n${value}` : value;
      }
    }
    if (fields.data === undefined) return;
    events.push({ event: fields.event ?? 'message', data: JSON.parse(fields.data), id: fields.id, at: performance.now() });
    for (const w of [...waiters]) w();
  };

  if (res.body && res.ok) {
    void (async () => {
      const decoder = new TextDecoder();
      let buffer = '';
      try {
        for await (const chunk of res.body as unknown as AsyncIterable<Uint8Array>) {
          buffer += decoder.decode(chunk, { stream: true });
          let cut: number;
          while ((cut = buffer.indexOf('\n\n')) >= 0) {
            onFrame(buffer.slice(0, cut));
            buffer = buffer.slice(cut + 2);
          }
        }
      } catch {
        // aborted by close()
      }
      endedResolve();
    })();
  } else {
    endedResolve();
  }

  return {
    status: res.status,
    contentType: res.headers.get('content-type'),
    events,
    comments,
    ended,
    next(match, timeoutMs = 2000) {
      return new Promise((resolve, reject) => {
        const check = () => {
          const found = events.find(match);
          if (!found) return false;
          waiters.delete(check);
          clearTimeout(timer);
          resolve(found);
          return true;
        };
        const timer = setTimeout(() => {
          waiters.delete(check);
          reject(new Error(`no matching event within ${timeoutMs} ms; got ${JSON.stringify(events.map((e) => e.event))}`));
        }, timeoutMs);
        if (!check()) waiters.add(check);
      });
    },
    close() {
      abort.abort();
    },
  };
}
