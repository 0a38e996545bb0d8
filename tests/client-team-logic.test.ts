// The client's rules for working together, without a browser: which cells a lock or protected range
// keeps me out of, how a colleague's revision enters my engine without touching my unsaved work,
// revisions applied in order exactly once, and presence throttling. Conflicts, history and the audit
// log's words are in client-team-conflicts.test.ts.
import { beforeEach, describe, expect, it, vi } from 'vitest';
import type { Protection, ProtectedRange } from '../shared/team.js';
import type { WorkbookModel } from '../src/core/workbook/model/workbookModel.js';
import { blockReason, editRuleFor, isCellEditable } from '../src/core/team/editability.js';
import { applyRemoteRevision, planCellChanges, type RemoteRevision } from '../src/features/live/remoteRevision.js';
import { RevisionFeed } from '../src/features/live/revisionFeed.js';
import { LatestThrottle, type ThrottleClock } from '../src/features/live/presenceThrottle.js';
import { parseCellRange } from '../shared/cellRange.js';

const ada = { id: 'u-ada', name: 'Ada Okafor' };
const ben = { id: 'u-ben', name: 'Ben Laszlo' };
const cy = { id: 'u-cy', name: 'Cy Moreau' };

function range(text: string, editors: { id: string; name: string }[], sheetId = 's1'): ProtectedRange {
  return { id: `r-${text}`, sheetId, range: text, bounds: parseCellRange(text)!, editors, createdBy: editors[0], createdAt: 0 };
}
/** A locked sheet as the server sends it: the lock, and its editors as the sheet's editor roles. */
const locked = (sheetId: string, editors: { id: string; name: string }[], reason = 'values checked'): Pick<Protection, 'locks' | 'sheetRoles'> => ({
  locks: [{ sheetId, lockedBy: editors[0], reason, editors, createdAt: 0 }],
  sheetRoles: [{ sheetId, overrides: editors.map((user) => ({ user, role: 'editor' as const, setBy: editors[0], viaLock: true, since: 0 })) }],
});
/** Workbook editors, as the people of these tests are. */
const as = (person: { id: string }) => ({ id: person.id, role: 'editor' as const });

describe('protected ranges and sheet locks in the grid', () => {
  const header: Protection = { locks: [], sheetRoles: [], protectedRanges: [range('A1:C1', [ada, ben])] };

  it('keeps everyone but the named editors out of every cell of A1:C1, and only those cells', () => {
    for (const col of [0, 1, 2]) {
      expect(isCellEditable(header, as(cy), 's1', 0, col)).toBe(false);
      expect(isCellEditable(header, as(ben), 's1', 0, col)).toBe(true);
    }
    expect(isCellEditable(header, as(cy), 's1', 0, 3)).toBe(true); // D1: just outside
    expect(isCellEditable(header, as(cy), 's1', 1, 0)).toBe(true); // A2: the row below
    expect(isCellEditable(header, as(cy), 's2', 0, 0)).toBe(true); // the same address on another sheet
  });

  it('treats whole columns (B:C) and whole rows (2:3) as reaching the edge of the grid', () => {
    const p: Protection = { locks: [], sheetRoles: [], protectedRanges: [range('B:C', [ada]), range('2:3', [ada])] };
    expect(isCellEditable(p, as(cy), 's1', 999_999, 2)).toBe(false); // C1000000
    expect(isCellEditable(p, as(cy), 's1', 0, 3)).toBe(true); // D1
    expect(isCellEditable(p, as(cy), 's1', 2, 1_999)).toBe(false); // row 3, last column
    expect(isCellEditable(p, as(cy), 's1', 3, 0)).toBe(true); // A4
  });

  it('locks a whole sheet against all but the people on the lock, whatever the ranges say', () => {
    const p: Protection = { ...locked('s1', [ada]), protectedRanges: [range('A1', [ada, cy])] };
    expect(isCellEditable(p, as(cy), 's1', 0, 0)).toBe(false);
    expect(isCellEditable(p, as(cy), 's1', 500, 40)).toBe(false);
    expect(isCellEditable(p, as(ada), 's1', 500, 40)).toBe(true);
    expect(isCellEditable(p, as(cy), 's2', 0, 0)).toBe(true);
  });

  it('gives the greyed cell a reason naming who locked it, why, and who may still edit', () => {
    const rule = editRuleFor({ ...locked('s1', [ada, ben], 'reference values, do not touch'), protectedRanges: [] }, as(cy))!;
    expect(rule('s1', 4, 4)).toBe('View only — Ada Okafor locked this sheet: “reference values, do not touch”. Editors here: Ada Okafor, Ben Laszlo.');
    expect(blockReason({ kind: 'range', range: range('A1:C1', [ada]) })).toBe('View only — A1:C1 is protected by Ada Okafor. Editors of the range: Ada Okafor.');
  });

  it('hands the grid no rule at all when nothing is protected (no per-cell cost)', () => {
    expect(editRuleFor({ locks: [], sheetRoles: [], protectedRanges: [] }, as(cy))).toBeNull();
  });
});

// ---- a colleague's revision in my engine ----

import { session } from './helpers/workbookSession.js';

const rev = (revision: number, changes: [string, number, number, string, string][], sheetOps: unknown[] = []): RemoteRevision => ({
  revision,
  kind: 'edit',
  authorId: ben.id,
  changes: changes.map(([sheetId, row, col, before, after]) => ({ sheetId, row, col, before, after })),
  sheetOps,
});
const value = (m: WorkbookModel, row: number, col: number, sheet = 's1') => m.view(sheet, row, col)?.display ?? '';

describe('a colleague’s revision arriving over the live stream', () => {
  it('writes their input and recomputes what depends on it (N2 bond order 3, O2 bond order 2: Atkins & de Paula, Physical Chemistry, MO theory; from memory)', () => {
    const { model, queue } = session([[0, 0, 'N2'], [0, 1, '=BONDORDER(A1)']]);
    model.rows('s1');
    expect(value(model, 0, 1)).toBe('3');
    const result = applyRemoteRevision(model, queue, rev(5, [['s1', 0, 0, 'N2', 'O2']]));
    expect(result.writes).toEqual([{ sheetId: 's1', row: 0, col: 0, input: 'O2' }]);
    expect(value(model, 0, 1)).toBe('2');
    expect(queue.waiting).toEqual([]); // nothing of theirs is sent back
  });

  it('never overwrites a cell whose input of mine is still waiting to be saved, and keeps it a conflict', () => {
    const { model, queue } = session([[0, 0, 'N2']]);
    model.edit([{ sheetId: 's1', row: 0, col: 0, input: 'CO' }]);
    const result = applyRemoteRevision(model, queue, rev(5, [['s1', 0, 0, 'N2', 'O2'], ['s1', 1, 0, '', 'F2']]));
    expect(model.input('s1', 0, 0)).toBe('CO');
    expect(model.input('s1', 1, 0)).toBe('F2');
    expect(result.heldBack).toEqual([{ sheetId: 's1', row: 0, col: 0, input: 'O2' }]);
    expect(result.advanced).toBe(false);
    expect(queue.baseRevision).toBe(4); // the server will still report A1 as changed after revision 4
  });

  it('lets the next patch build on a revision that touched none of my waiting cells', () => {
    const { model, queue } = session([[0, 0, 'N2']]);
    model.edit([{ sheetId: 's1', row: 5, col: 5, input: 'x' }]);
    expect(applyRemoteRevision(model, queue, rev(5, [['s1', 0, 0, 'N2', 'O2']])).advanced).toBe(true);
    expect(queue.baseRevision).toBe(5);
    // …but not past a gap: revision 7 while 6 is missing must not be built on.
    expect(applyRemoteRevision(model, queue, rev(7, [['s1', 1, 0, '', 'B2']])).advanced).toBe(false);
    expect(queue.baseRevision).toBe(5);
  });

  it('treats the same input from both sides as agreement, not as a conflict', () => {
    const plan = planCellChanges([{ sheetId: 's1', row: 0, col: 0, before: '', after: 'NO' }], [{ sheetId: 's1', row: 0, col: 0, input: 'NO' }], () => '');
    expect(plan).toEqual({ writes: [], heldBack: [] });
  });

  it('applies tab operations once even when my own come back over the stream', () => {
    const { model, queue } = session([[0, 0, 'N2']]);
    const add = { op: 'add', sheetId: 's2', name: 'Ions', position: 0, settings: {}, cells: [[0, 0, 'CN-']] };
    applyRemoteRevision(model, queue, rev(5, [], [add]));
    applyRemoteRevision(model, queue, rev(6, [], [add, { op: 'rename', sheetId: 's2', before: 'Ions', after: 'Anions' }]));
    expect(model.sheets.map((s) => [s.name, s.position])).toEqual([
      ['Anions', 0],
      ['Sheet1', 1],
    ]);
    expect(model.input('s2', 0, 0)).toBe('CN-');
  });

  it('hands back my unsent inputs on a tab a colleague deleted, so they can be set aside', () => {
    const { model, queue } = session([[0, 0, 'N2']]);
    applyRemoteRevision(model, queue, rev(5, [], [{ op: 'add', sheetId: 's2', name: 'Draft', position: 1, settings: {}, cells: [] }]));
    model.edit([{ sheetId: 's2', row: 2, col: 2, input: '=BONDORDER("NO+")' }]);
    const result = applyRemoteRevision(model, queue, rev(6, [], [{ op: 'delete', sheetId: 's2', name: 'Draft', position: 1, settings: {}, cells: [] }]));
    expect(result.orphaned).toEqual([{ sheetId: 's2', row: 2, col: 2, input: '=BONDORDER("NO+")' }]);
    expect(model.hasSheet('s2')).toBe(false);
    expect(queue.waiting).toEqual([]);
  });
});

describe('display settings of mine on their way to the server', () => {
  const settingsOp = (after: Record<string, unknown>) => ({ op: 'settings', sheetId: 's1', before: {}, after });

  it('are not put back by a settings revision that arrives while they wait (my previous save coming back)', () => {
    const { model, queue } = session([[0, 0, 'N2']]);
    const mine = { ...model.sheet('s1').display, precision: 2, freezeHeaderRow: true };
    model.displaySaves.begin('s1');
    model.setDisplay('s1', mine);
    applyRemoteRevision(model, queue, rev(5, [], [settingsOp({ precision: null, freezeHeaderRow: false })]));
    expect(model.sheet('s1').display.precision).toBe(2);
    expect(model.sheet('s1').display.freezeHeaderRow).toBe(true);
    expect(model.displaySaves.end('s1', 6)).toBeNull(); // my save (revision 6) came after it
    expect(model.sheet('s1').display.precision).toBe(2);
  });

  it('give way to a colleague’s change the server took after my save', () => {
    const { model, queue } = session([[0, 0, 'N2']]);
    model.displaySaves.begin('s1');
    model.displaySaves.begin('s1'); // a second save while the first is under way
    applyRemoteRevision(model, queue, rev(7, [], [settingsOp({ precision: 4 })]));
    expect(model.displaySaves.end('s1', 5)).toBeNull(); // one of mine still waits
    expect(model.displaySaves.end('s1', 6)?.precision).toBe(4);
    applyRemoteRevision(model, queue, rev(8, [], [settingsOp({ precision: 1 })]));
    expect(model.sheet('s1').display.precision).toBe(1); // nothing of mine waiting: shown at once
  });

  it('leave the server’s settings on screen when my save failed', () => {
    const { model, queue } = session([[0, 0, 'N2']]);
    model.displaySaves.begin('s1');
    applyRemoteRevision(model, queue, rev(5, [], [settingsOp({ precision: 3 })]));
    expect(model.displaySaves.end('s1', null)?.precision).toBe(3);
  });
});

describe('revisions in order, each once', () => {
  const make = (start: number, fetched: Record<number, RemoteRevision> = {}) => {
    const applied: number[] = [];
    const asked: number[] = [];
    let behind: number | null = null;
    const feed = new RevisionFeed({
      start,
      apply: (r) => applied.push(r.revision),
      fetchRevision: async (n) => (asked.push(n), fetched[n] ?? rev(n, [])),
      onTooFarBehind: (n) => (behind = n),
      maxFetched: 5,
    });
    return { feed, applied, asked, behind: () => behind };
  };

  it('drops replays of revisions already applied (a reconnect with Last-Event-ID)', () => {
    const f = make(4);
    f.feed.receive(rev(5, []));
    f.feed.receive(rev(5, []));
    f.feed.receive(rev(4, []));
    expect(f.applied).toEqual([5]);
  });

  it('fetches the revisions between the page load and the first event, and applies them first', async () => {
    const f = make(4);
    f.feed.receive(rev(8, []));
    await vi.waitFor(() => expect(f.applied).toEqual([5, 6, 7, 8]));
    expect(f.asked).toEqual([5, 6, 7]);
  });

  it('catches up to the revision `ready` names, then asks for a reload when too far behind', async () => {
    const f = make(4);
    f.feed.catchUp(6);
    await vi.waitFor(() => expect(f.applied).toEqual([5, 6]));
    f.feed.catchUp(20);
    expect(f.behind()).toBe(20);
    expect(f.applied).toEqual([5, 6]);
  });
});

describe('presence throttling', () => {
  let now = 0;
  const timers: { at: number; fn: () => void }[] = [];
  const clock: ThrottleClock = {
    now: () => now,
    setTimeout: (fn, ms) => (timers.push({ at: now + ms, fn }), timers.length - 1),
    clearTimeout: (h) => void (timers[h as number].fn = () => {}),
  };
  const advance = (ms: number) => {
    now += ms;
    for (const t of timers.filter((t) => t.at <= now)) (timers.splice(timers.indexOf(t), 1), t.fn());
  };
  beforeEach(() => ((now = 0), (timers.length = 0)));

  it('sends the first move at once, then only where the cursor settles, at most once per interval', () => {
    const sent: string[] = [];
    const t = new LatestThrottle<string>((c) => sent.push(c), 250, Object.is, clock);
    t.push('A1');
    t.push('A2');
    t.push('A3');
    advance(100);
    t.push('A4');
    expect(sent).toEqual(['A1']);
    advance(150);
    expect(sent).toEqual(['A1', 'A4']);
    advance(1000);
    expect(sent).toEqual(['A1', 'A4']);
  });

  it('does not send the same cell twice, but does after a reconnect', () => {
    const sent: string[] = [];
    const t = new LatestThrottle<string>((c) => sent.push(c), 250, Object.is, clock);
    t.push('B2');
    advance(300);
    t.push('B2');
    expect(sent).toEqual(['B2']);
    t.reset();
    t.push('B2');
    expect(sent).toEqual(['B2', 'B2']);
  });
});


// ---- the rule for a member's role on one sheet ----

import { effectiveSheetRole } from '../shared/permissions.js';

describe("a member's role on a sheet", () => {
  // Written out by hand from the rule as the team agreed it: an override wins either way; otherwise a
  // workbook viewer views, a lock makes everyone else a viewer, and the workbook role holds.
  //               workbook role  locked  override   → role, source
  const table: [('owner' | 'editor' | 'viewer' | null), boolean, ('editor' | 'viewer' | null), string, string][] = [
    ['owner', false, null, 'editor', 'workbook'],
    ['owner', true, null, 'viewer', 'lock'],
    ['owner', true, 'editor', 'editor', 'override'],
    ['editor', false, null, 'editor', 'workbook'],
    ['editor', false, 'viewer', 'viewer', 'override'],
    ['editor', true, null, 'viewer', 'lock'],
    ['editor', true, 'editor', 'editor', 'override'],
    ['viewer', false, null, 'viewer', 'workbook'],
    ['viewer', false, 'editor', 'editor', 'override'],
    ['viewer', true, null, 'viewer', 'workbook'],
    ['viewer', true, 'editor', 'editor', 'override'],
    [null, false, null, 'viewer', 'workbook'], // a site admin looking in
  ];
  it.each(table)('%s, locked %s, override %s → %s (%s)', (role, locked, override, expectedRole, source) => {
    expect(effectiveSheetRole(role, { locked, override })).toEqual({ role: expectedRole, source });
  });

  it('greys every cell of a sheet that makes a workbook editor its viewer, and opens one to a workbook viewer', () => {
    const p: Protection = {
      locks: [],
      sheetRoles: [{ sheetId: 's1', overrides: [{ user: cy, role: 'viewer', setBy: ada, viaLock: false, since: 0 }, { user: ben, role: 'editor', setBy: ada, viaLock: false, since: 0 }] }],
      protectedRanges: [],
    };
    expect(isCellEditable(p, { id: cy.id, role: 'editor' }, 's1', 3, 3)).toBe(false);
    expect(isCellEditable(p, { id: cy.id, role: 'editor' }, 's2', 3, 3)).toBe(true);
    expect(isCellEditable(p, { id: ben.id, role: 'viewer' }, 's1', 3, 3)).toBe(true);
    expect(isCellEditable(p, { id: ben.id, role: 'viewer' }, 's2', 3, 3)).toBe(false);
    expect(editRuleFor(p, { id: cy.id, role: 'editor' })!('s1', 0, 0)).toBe('View only — Ada Okafor made you a viewer of this sheet; an owner can change that in the team panel.');
  });
});
