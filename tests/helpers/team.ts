// A small team on a fresh test app: a site admin (the first account), an owner, two editors, a viewer
// and someone from outside, with one shared workbook. Each agent keeps its own session cookie.
import { expect } from 'vitest';
import type { MailMessage } from '../../shared/team.js';
import type { WorkbookPayload } from '../../shared/workbooks.js';
import { makeTestApp, sessionCookieOf, testPassword, type TestApp, type TestAppOptions } from './app.js';

export type Agent = ReturnType<TestApp['agent']>;

export interface Person {
  agent: Agent;
  user: { id: string; email: string; name: string };
  /** `orbitab_session=…`, for clients that are not supertest agents (fetch, EventSource). */
  cookie: string;
}

/** Signs up through the API and, unless `verified: false`, opens the mailed verification link. */
export async function signUpPerson(t: TestApp, email: string, name: string, options: { verified?: boolean } = {}): Promise<Person> {
  const agent = t.agent();
  const res = await agent.post('/api/auth/sign-up').send({ email, password: testPassword, name });
  if (res.status !== 201) throw new Error(`sign-up of ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  const user = options.verified === false ? res.body.user : await t.verifyEmail(email);
  return { agent, user, cookie: sessionCookieOf(res)!.split(';')[0] };
}

export async function makeTeam(options: TestAppOptions = {}) {
  const t = makeTestApp(options);
  // The first account on a site is its admin; here that is someone who is in no workbook.
  const admin = await signUpPerson(t, 'admin@lab.test', 'Site Admin');
  const owner = await signUpPerson(t, 'ann@lab.test', 'Ann Analyst');
  const editor = await signUpPerson(t, 'bob@lab.test', 'Bob Bench');
  const editor2 = await signUpPerson(t, 'cara@lab.test', 'Cara Chemist');
  const viewer = await signUpPerson(t, 'vic@lab.test', 'Vic Viewer');
  const outsider = await signUpPerson(t, 'olga@elsewhere.test', 'Olga Outside');
  return { ...t, admin, owner, editor, editor2, viewer, outsider };
}
export type Team = Awaited<ReturnType<typeof makeTeam>>;

/** A workbook of the owner's, shared through the API with the two editors and the viewer. */
export async function sharedWorkbook(team: Team, title = 'Radical screen'): Promise<WorkbookPayload> {
  const created = await team.owner.agent.post('/api/workbooks').send({ title });
  expect(created.status).toBe(201);
  const id = created.body.workbook.id as string;
  for (const [person, role] of [[team.editor, 'editor'], [team.editor2, 'editor'], [team.viewer, 'viewer']] as const) {
    const added = await team.owner.agent.post(`/api/workbooks/${id}/members`).send({ email: person.user.email, role });
    expect(added.status, `adding ${person.user.email}`).toBe(201);
  }
  return (await team.owner.agent.get(`/api/workbooks/${id}`).expect(200)).body as WorkbookPayload;
}

export async function load(agent: Agent, id: string): Promise<WorkbookPayload> {
  return (await agent.get(`/api/workbooks/${id}`).expect(200)).body as WorkbookPayload;
}

/** The dev inbox as the admin sees it, newest first. */
export async function inbox(team: Team): Promise<MailMessage[]> {
  return (await team.admin.agent.get('/api/admin/mail').expect(200)).body.messages as MailMessage[];
}

/** The token at the end of an invitation link in a message's text. */
export function invitationToken(text: string): string {
  const m = /\/invitations\/([A-Za-z0-9_-]+)\s*$/m.exec(text);
  if (!m) throw new Error(`no invitation link in:\n${text}`);
  return m[1];
}
