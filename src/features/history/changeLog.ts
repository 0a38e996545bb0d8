// The words of the change log: what each saved change did to which cells (before → after, the first
// few and then a count), tab operations in a sentence, and runs of display-only changes (decimals,
// frozen row, widths, chart) by one person folded into one entry.
import { cellName } from '@shared/a1.js';
import type { RevisionPreview, RevisionSummary, SheetOpPreview, SheetSettings } from '@shared/workbooks.js';

/** "1 change", "30 changes". */
export const changeCountText = (n: number) => `${n.toLocaleString('en')} ${n === 1 ? 'change' : 'changes'}`;

const cellsText = (n: number) => `${n.toLocaleString('en')} ${n === 1 ? 'cell' : 'cells'}`;

/** A sheet's current name, or null when it has since been removed. */
export type SheetNameOf = (sheetId: string) => string | null;

const quoted = (name: string) => `“${name}”`;
const sheetLabel = (id: string, nameOf: SheetNameOf) => {
  const name = nameOf(id);
  return name === null ? 'a removed sheet' : quoted(name);
};

const decimalsText = (p: unknown) => (typeof p === 'number' ? String(p) : 'auto');

/** What a settings change changed, in words; fields the grid does not show are named in general. */
export function describeSettingsChange(before: SheetSettings, after: SheetSettings): string[] {
  const out: string[] = [];
  if ((before.precision ?? null) !== (after.precision ?? null)) out.push(`decimals ${decimalsText(before.precision)} → ${decimalsText(after.precision)}`);
  if ((before.freezeHeaderRow === true) !== (after.freezeHeaderRow === true)) out.push(after.freezeHeaderRow === true ? 'row 1 frozen' : 'row 1 unfrozen');
  if (JSON.stringify(before.columnWidths ?? {}) !== JSON.stringify(after.columnWidths ?? {})) out.push('column widths');
  if (JSON.stringify(before.chart ?? null) !== JSON.stringify(after.chart ?? null)) out.push(after.chart ? 'chart' : 'chart removed');
  const known = new Set(['precision', 'freezeHeaderRow', 'columnWidths', 'chart']);
  const others = [...new Set([...Object.keys(before), ...Object.keys(after)])].filter((k) => !known.has(k) && JSON.stringify(before[k]) !== JSON.stringify(after[k]));
  if (others.length > 0) out.push('layout');
  return out.length > 0 ? out : ['no visible change'];
}

export function describeSheetOp(op: SheetOpPreview, nameOf: SheetNameOf): string {
  switch (op.op) {
    case 'add':
      return `Added sheet ${quoted(op.name)}`;
    case 'delete':
      return `Removed sheet ${quoted(op.name)}`;
    case 'rename':
      return `Renamed sheet ${quoted(op.before)} to ${quoted(op.after)}`;
    case 'move':
      return `Moved sheet ${sheetLabel(op.sheetId, nameOf)} to place ${op.to + 1}`;
    case 'settings':
      return `Display of ${sheetLabel(op.sheetId, nameOf)}: ${describeSettingsChange(op.before, op.after).join(', ')}`;
  }
}

/** A change with nothing but display settings: nothing any formula reads. */
export function isDisplayOnly(r: Pick<RevisionSummary, 'kind' | 'preview'>): boolean {
  const p = r.preview;
  return r.kind !== 'restore' && p.cellCount === 0 && p.sheetOpCount > 0 && p.sheetOpCount === p.sheetOps.length && p.sheetOps.every((o) => o.op === 'settings');
}

/** The one-line headline of an entry. */
export function entryHeadline(r: Pick<RevisionSummary, 'kind' | 'preview'>, nameOf: SheetNameOf): string {
  const p = r.preview;
  if (r.kind === 'restore') {
    const what = p.restoredSheetId ? `sheet ${sheetLabel(p.restoredSheetId, nameOf)}` : 'the workbook';
    return `Brought back ${what} as it was after #${p.restoredFrom ?? '?'}`;
  }
  if (r.kind === 'import') return `Imported ${cellsText(p.cellCount)}${p.sheetOpCount > 0 ? ` on ${p.sheetOpCount === 1 ? 'a new sheet' : `${p.sheetOpCount} new sheets`}` : ''}`;
  if (p.sheetOps.length > 0) {
    const first = describeSheetOp(p.sheetOps[0], nameOf);
    return p.sheetOpCount > 1 ? `${first}, and ${p.sheetOpCount - 1} more tab ${p.sheetOpCount === 2 ? 'change' : 'changes'}` : first;
  }
  return `Edited ${cellsText(p.cellCount)}`;
}

export interface CellLine {
  /** "B2", or "Sheet2!B2" when the entry touches more than one sheet. */
  where: string;
  before: string;
  after: string;
}

const shown = (input: string, max = 48) => (input === '' ? '(empty)' : input.length > max ? `${input.slice(0, max - 1)}…` : input);

/** The listed cell changes of an entry, and how many more it made ("and 25 more"; '' when none). */
export function cellLines(p: RevisionPreview, nameOf: SheetNameOf): { lines: CellLine[]; more: string } {
  const sheets = new Set(p.cells.map((c) => c.sheetId));
  const lines = p.cells.map((c) => {
    const name = sheets.size > 1 ? `${nameOf(c.sheetId) ?? 'removed sheet'}!` : '';
    return { where: `${name}${cellName(c.row, c.col)}`, before: shown(c.before), after: shown(c.after) };
  });
  const rest = p.cellCount - p.cells.length;
  return { lines, more: rest > 0 ? `and ${rest.toLocaleString('en')} more` : '' };
}

/** The sheets an entry touched (by id), for bringing one of them back. */
export function touchedSheets(p: RevisionPreview): string[] {
  return [...new Set([...p.cells.map((c) => c.sheetId), ...p.sheetOps.map((o) => o.sheetId), ...(p.restoredSheetId ? [p.restoredSheetId] : [])])];
}

export type LogEntry = { kind: 'one'; revision: RevisionSummary } | { kind: 'display'; revisions: RevisionSummary[] };

/**
 * Newest first, as listed. Display-only changes next to each other by the same person become one
 * entry: a session of Decimals and Freeze clicks reads as one line, not forty.
 */
export function groupLog(revisions: readonly RevisionSummary[]): LogEntry[] {
  const out: LogEntry[] = [];
  for (const r of revisions) {
    const last = out[out.length - 1];
    if (isDisplayOnly(r) && last?.kind === 'display' && last.revisions[0].author?.id === r.author?.id) last.revisions.push(r);
    else out.push(isDisplayOnly(r) ? { kind: 'display', revisions: [r] } : { kind: 'one', revision: r });
  }
  return out;
}

/**
 * The words of a folded run of display changes, newest first as listed: per sheet, from how it was
 * before the oldest to how it is after the newest ("Display of “Sheet1” changed (4 times): decimals
 * 3 → 5, row 1 frozen").
 */
export function displayRunText(revisions: readonly RevisionSummary[], nameOf: SheetNameOf): string {
  const net = new Map<string, { before: SheetSettings; after: SheetSettings }>();
  for (const r of [...revisions].reverse())
    for (const o of r.preview.sheetOps) {
      if (o.op !== 'settings') continue;
      const seen = net.get(o.sheetId);
      net.set(o.sheetId, { before: seen?.before ?? o.before, after: o.after });
    }
  const times = revisions.length === 1 ? '' : ` (${revisions.length} times)`;
  const parts = [...net].map(([id, { before, after }]) => {
    const what = describeSettingsChange(before, after);
    return `${net.size > 1 ? `${sheetLabel(id, nameOf)}: ` : ''}${what[0] === 'no visible change' ? 'back as it was' : what.join(', ')}`;
  });
  const where = net.size === 1 ? ` of ${sheetLabel([...net.keys()][0], nameOf)}` : '';
  return `Display${where} changed${times}: ${parts.join('; ')}`;
}
