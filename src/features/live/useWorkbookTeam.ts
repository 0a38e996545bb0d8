// Everything about the other people on an open workbook, in one hook the workspace calls once:
// the live stream, my role as it changes, the sheet locks and protected ranges (pushed into the grid
// model as its edit rule, so locked cells grey out and refuse edits), presence and my cursor, and
// the inputs of mine that were set aside.
import { useMutation, useQuery } from '@tanstack/react-query';
import { useCallback, useEffect, useRef, useState } from 'react';
import type { AccessRole, WorkbookAction } from '@shared/permissions.js';
import type { PresenceInput, Protection, SheetActor } from '@shared/team.js';
import { api } from '../../lib/api.js';
import { useMe } from '../../core/session/me.js';
import type { KeyValueStorage } from '../../core/workbook/save/pendingStore.js';
import { workbookQueryOptions } from '../../core/workbook/api.js';
import type { WorkbookSession } from '../../core/workbook/session/useWorkbookSession.js';
import { protectionOf, useProtection } from '../../core/team/protection.js';
import { actorOf, editRuleFor, editsThroughSheetRole, structureRuleFor } from '../../core/team/editability.js';
import type { SetAsideInput } from './conflictResolution.js';
import { LatestThrottle } from './presenceThrottle.js';
import { addSetAside, loadSetAside, saveSetAside } from './setAside.js';
import { useLiveUpdates, type LiveState } from './useLiveUpdates.js';
import { workbookPath } from '@shared/workbooks.js';

export type TeamDialog = 'team' | 'protect' | 'history' | 'audit' | null;

export interface WorkbookTeam {
  myId: string;
  /** Me as sheet roles see me (id and membership role). */
  me: SheetActor;
  role: AccessRole;
  /** What I may do here, as the server decided it. */
  actions: WorkbookAction[];
  protection: Protection;
  live: LiveState;
  setAside: SetAsideInput[];
  addSetAside: (inputs: SetAsideInput[]) => void;
  dismissSetAside: () => void;
  /** Which team dialog is open (the toolbar and the protection banner both open them). */
  dialog: TeamDialog;
  openDialog: (dialog: TeamDialog) => void;
}

function browserStorage(): KeyValueStorage | null {
  try {
    return window.localStorage;
  } catch {
    return null;
  }
}

const sameCell = (a: PresenceInput, b: PresenceInput) => a.sheetId === b.sheetId && a.row === b.row && a.col === b.col;

export function useWorkbookTeam(session: WorkbookSession, cursor: PresenceInput | null): WorkbookTeam {
  const { model } = session;
  const workbookId = model.id;
  const myId = useMe().data?.id ?? '';
  // The same cached load the session was built from (never refetched while open).
  const payload = useQuery(workbookQueryOptions(workbookId)).data;
  const protection = useProtection(workbookId, payload ? protectionOf(payload) : undefined);
  const [access, setAccess] = useState<{ role: AccessRole; actions: WorkbookAction[] }>({ role: model.role, actions: model.actions });
  const [dialog, openDialog] = useState<TeamDialog>(null);

  const [setAside, setSetAside] = useState(() => loadSetAside(browserStorage(), workbookId));
  const addToSetAside = useCallback(
    (inputs: SetAsideInput[]) =>
      setSetAside((old) => {
        const next = addSetAside(old, inputs);
        saveSetAside(browserStorage(), workbookId, next);
        return next;
      }),
    [workbookId],
  );
  const dismissSetAside = useCallback(() => {
    saveSetAside(browserStorage(), workbookId, []);
    setSetAside([]);
  }, [workbookId]);

  const live = useLiveUpdates(session, {
    loadedRevision: payload?.revision ?? session.queue.baseRevision,
    onRole: (next) => {
      model.role = next.role;
      model.actions = next.actions;
      model.invalidateViews(); // greys or un-greys every cell for the new role
      setAccess(next);
    },
    onOrphaned: addToSetAside,
  });

  const me = actorOf(myId, access.role);
  const meRole = me.role;
  useEffect(() => {
    // Cells, and rows and columns of a sheet I only view, refuse edits for the same reasons the API
    // gives. A sheet that names me editor lets me edit there even as a workbook viewer.
    const who = { id: myId, role: meRole };
    const others = access.actions.filter((a) => a !== 'editCells');
    const edits = meRole === 'owner' || meRole === 'editor' || editsThroughSheetRole(protection, who);
    model.actions = edits ? [...others, 'editCells'] : others;
    model.structureRule = structureRuleFor(protection, who);
    model.setEditRule(editRuleFor(protection, who));
  }, [model, protection, myId, meRole, access]);

  // Where my cursor is, for everyone else's chips: throttled, and sent again after each reconnect
  // (the server forgets a cursor when its stream closes).
  const presence = useMutation({
    mutationFn: (cell: PresenceInput) => api<void>(workbookPath(workbookId, 'presence'), { method: 'POST', body: cell }),
  });
  const send = useRef(presence.mutate);
  send.current = presence.mutate;
  const throttle = useRef<LatestThrottle<PresenceInput> | null>(null);
  throttle.current ??= new LatestThrottle<PresenceInput>((cell) => send.current(cell), undefined, sameCell);
  useEffect(() => () => throttle.current?.dispose(), []);
  useEffect(() => {
    throttle.current?.reset();
  }, [live.connects]);
  const { sheetId, row, col } = cursor ?? {};
  useEffect(() => {
    if (live.connection !== 'live' || sheetId === undefined || row === undefined || col === undefined) return;
    throttle.current?.push({ sheetId, row, col });
  }, [sheetId, row, col, live.connection, live.connects]);

  return { myId, me, role: access.role, actions: access.actions, protection, live, setAside, addSetAside: addToSetAside, dismissSetAside, dialog, openDialog };
}
