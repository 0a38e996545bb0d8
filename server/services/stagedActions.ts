// One user action larger than a patch (a sort or a column deleted on a long sheet): its parts arrive
// one request each and are held here, unapplied; the last part applies them all through applyPatch,
// as one revision, with the same locks, conflicts and live event as any patch. Held in memory: a
// restart forgets unfinished actions, and the client sends such an action again from its first part.
// Bounds: one unfinished action per person and workbook (a new first part replaces it), parts expire
// stagedActionTtlMs after the last one arrived, at most maxCellsPerAction cells in an action, and at
// most maxHeldActions actions held by the whole server.
import { maxCellsPerAction, stagedActionTtlMs, type PatchInput, type PatchPart, type PatchPartResult, type PatchResult } from '../../shared/workbooks.js';
import type { AppContext } from '../context.js';
import { badRequest, HttpError } from '../errors.js';
import { placeNumber } from './cellStore.js';
import { applyPatch, planPatch, writesText, type PatchPlan } from './patches.js';

/** Actions held at once, all people and workbooks together (~8 MB each at the cell limit). */
export const maxHeldActions = 32;

interface HeldAction {
  actionId: string;
  baseRevision: number;
  count: number;
  received: number;
  changes: PatchInput['changes'][];
  /** What each part would write, read when it arrived (a read transaction of its own, so the last part's request does less). */
  plans: PatchPlan[];
  writesJson: string[];
  cells: number;
  /** The place number (cellStore.ts) of every cell so far, per sheet: a cell may appear in one part only. */
  places: Map<string, Set<number>>;
  /** Date.now() after which the parts are dropped. */
  expiresAt: number;
}

const heldByApp = new WeakMap<AppContext, Map<string, HeldAction>>();

function heldOf(ctx: AppContext): Map<string, HeldAction> {
  let held = heldByApp.get(ctx);
  if (!held) heldByApp.set(ctx, (held = new Map()));
  return held;
}

const gone = (message: string) => new HttpError(410, 'action_expired', message);
const partRefused = (message: string) => new HttpError(400, 'part_refused', message);

/** Expired actions go at the next part anyone sends (no timers; at most maxHeldActions to look at). */
function sweep(held: Map<string, HeldAction>, now: number) {
  for (const [key, action] of held) if (action.expiresAt <= now) held.delete(key);
}

/**
 * Takes part `part.index` of an action. Parts before the last answer what is held so far; the last
 * applies the whole action and answers as a patch does (or throws as a patch does: 409 with every
 * conflicting cell, 403 for a lock). Whatever goes wrong, nothing of the action is applied unless all
 * of it is, and a refused part forgets the action.
 */
export function takePatchPart(ctx: AppContext, workbookId: string, authorId: string, patch: PatchInput, part: PatchPart): PatchResult | PatchPartResult {
  const held = heldOf(ctx);
  const now = Date.now();
  sweep(held, now);
  const key = `${workbookId}\u0000${authorId}`;
  let action = held.get(key);
  const where = `part ${part.index + 1} of ${part.count} of action ${part.actionId}`;

  if (part.index === 0) {
    held.delete(key); // a new action from this person replaces an unfinished one
    if (held.size >= maxHeldActions) {
      throw new HttpError(503, 'busy', `the server is holding ${held.size} unfinished large actions; try again in a minute`, undefined, { 'Retry-After': '30' });
    }
    action = { actionId: part.actionId, baseRevision: patch.baseRevision, count: part.count, received: 0, changes: [], plans: [], writesJson: [], cells: 0, places: new Map(), expiresAt: 0 };
    held.set(key, action);
  } else if (!action || action.actionId !== part.actionId) {
    throw gone(`${where}: its earlier parts are no longer held (they are kept ${stagedActionTtlMs / 1000} s after the last one, and not over a restart); nothing of it was saved — send it again from its first part`);
  }

  try {
    if (part.index !== action.received) throw partRefused(`${where} came after part ${action.received} of ${action.count}; send the parts in order. Nothing of the action was saved`);
    if (part.count !== action.count) throw partRefused(`${where}: its first part said ${action.count} parts; nothing of the action was saved`);
    if (patch.baseRevision !== action.baseRevision) throw partRefused(`${where}: baseRevision ${patch.baseRevision} differs from the first part's ${action.baseRevision}; nothing of the action was saved`);
    if (action.cells + patch.changes.length > maxCellsPerAction) {
      throw new HttpError(413, 'action_too_large', `one action may change at most ${maxCellsPerAction.toLocaleString('en-US')} cells (it is applied as one revision, in one go); this one has more. Nothing of it was saved`);
    }
    patch.changes.forEach((c, i) => {
      let places = action.places.get(c.sheetId);
      if (!places) action.places.set(c.sheetId, (places = new Set()));
      const place = placeNumber(c);
      if (places.has(place)) throw badRequest(`${where}: changes.${i} is a cell an earlier part already changed; send one input per cell. Nothing of the action was saved`);
      places.add(place);
    });
    if (part.index + 1 < part.count) {
      // Conflicts are kept, not thrown: the last part reports all of them, as one patch would.
      const plan = ctx.db.transaction((tx) => planPatch(ctx, tx, workbookId, patch), { behavior: 'deferred' });
      action.plans.push(plan);
      action.writesJson.push(writesText(plan));
    }
  } catch (e) {
    held.delete(key);
    throw e;
  }

  action.changes.push(patch.changes);
  action.cells += patch.changes.length;
  action.received += 1;
  if (action.received < action.count) {
    action.expiresAt = now + stagedActionTtlMs;
    return { staged: { actionId: action.actionId, received: action.received, count: action.count, cells: action.cells } };
  }
  held.delete(key);
  return applyPatch(ctx, workbookId, authorId, { baseRevision: action.baseRevision, changes: action.changes.flat() }, { plans: action.plans, writesJson: action.writesJson, unplanned: patch.changes });
}
