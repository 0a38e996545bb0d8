// The setup the live-stream suites share (tests/sse.test.ts, tests/live-stream-limits.test.ts), registered
// in the calling describe: a team with a shared workbook, the app listening on a free port, and
// stream() to open a workbook's event stream as a person (signed out when null). Every stream opened
// so is closed, the server stopped and the mail transport ended after the suite.
import { afterAll, beforeAll } from 'vitest';
import type { WorkbookPayload } from '../../shared/workbooks.js';
import { listen, openEventStream, type EventStreamClient } from './eventStream.js';
import { makeTeam, sharedWorkbook, type Person, type Team } from './team.js';

export interface LiveStreamSuite {
  /** Filled in before the suite's first test. */
  t: Team;
  wb: WorkbookPayload;
  server: Awaited<ReturnType<typeof listen>>;
  stream(person: Person | null, workbookId?: string, headers?: Record<string, string>): Promise<EventStreamClient>;
}

export function liveStreamSuite(title: string): LiveStreamSuite {
  const open: EventStreamClient[] = [];
  const suite = {
    async stream(person: Person | null, workbookId = suite.wb.id, headers: Record<string, string> = {}) {
      const s = await openEventStream(`${suite.server.url}/api/workbooks/${workbookId}/events`, { ...(person ? { Cookie: person.cookie } : {}), ...headers });
      open.push(s);
      return s;
    },
  } as LiveStreamSuite;
  beforeAll(async () => {
    suite.t = await makeTeam();
    suite.wb = await sharedWorkbook(suite.t, title);
    suite.server = await listen(suite.t.app);
  });
  afterAll(async () => {
    open.forEach((s) => s.close());
    await suite.server.close();
    await suite.t.ctx.mail.stop();
  });
  return suite;
}
