// The client shows what the server allows: every workbook payload, list entry and live `ready` event
// carries the actions the user may take with all their roles together, so a site admin who is also a
// viewer sees the audit log button exactly when the server would answer the audit log.
import { beforeAll, describe, expect, it } from 'vitest';
import { allowedActions, workbookActions, type WorkbookAction } from '../shared/permissions.js';
import { makeTeam, sharedWorkbook, type Team } from './helpers/team.js';

let team: Team;
let id: string;

beforeAll(async () => {
  team = await makeTeam();
  id = (await sharedWorkbook(team)).id;
  // The site admin also joins as a viewer: two roles, with different rights.
  const added = await team.owner.agent.post(`/api/workbooks/${id}/members`).send({ email: team.admin.user.email, role: 'viewer' });
  expect(added.status).toBe(201);
});

const actionsOf = async (who: keyof Pick<Team, 'owner' | 'editor' | 'viewer' | 'admin'>) => (await team[who].agent.get(`/api/workbooks/${id}`).expect(200)).body.actions as WorkbookAction[];

describe('the allowed actions the server sends', () => {
  it('gives a site admin who is a viewer the union of both roles, audit log included', async () => {
    const actions = await actionsOf('admin');
    expect(actions).toEqual(allowedActions(['viewer', 'site-admin']));
    expect(actions).toContain('viewAudit');
    expect(actions).not.toContain('editCells');
    // …and the server answers the audit log for that user, as the actions say.
    expect((await team.admin.agent.get(`/api/workbooks/${id}/audit`)).status).toBe(200);
  });

  it('gives a plain viewer no audit log, and the server refuses it', async () => {
    const actions = await actionsOf('viewer');
    expect(actions).toEqual(['view', 'viewHistory', 'export']);
    expect((await team.viewer.agent.get(`/api/workbooks/${id}/audit`)).status).toBe(403);
  });

  it('gives an owner every action and an editor no member management', async () => {
    expect(await actionsOf('owner')).toEqual(Object.keys(workbookActions));
    const editor = await actionsOf('editor');
    expect(editor).toContain('editCells');
    expect(editor).not.toContain('manageMembers');
  });

  it('puts the same actions on each entry of the workbook list', async () => {
    const list = (await team.admin.agent.get('/api/workbooks').expect(200)).body.workbooks as { id: string; actions: WorkbookAction[] }[];
    expect(list.find((w) => w.id === id)?.actions).toEqual(await actionsOf('admin'));
  });
});
