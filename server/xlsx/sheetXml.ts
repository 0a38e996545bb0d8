// One worksheet part read directly: its layout (column widths, frozen pane, merged ranges, links)
// and its cells, each as the same CellReading the exceljs path makes (cellInput.ts), read the way
// exceljs 4.4 reads them (its cell and worksheet xforms) so both readers import a file alike.
// Where exceljs would read a sheet differently from how its XML is laid out — cells out of order or
// without an address, overlapping merges, a link on a formula — NotDirect sends the file to exceljs.
import { createRequire } from 'node:module';
import { cellName, parseRangeName, type CellRange } from '../../shared/a1.js';
import { cleanFormulaText, dateInput, numberInput, type CellReading } from './cellInput.js';
import { relationshipsOf, stringItemText, type Parts, type SheetEntry } from './xlsxParts.js';
import { attributesOf, eachAttribute, NotDirect, tagsNamed, textBetween } from './xmlText.js';

const require = createRequire(import.meta.url);
// exceljs's own translation of a shared formula from its master cell to another cell.
const { slideFormula } = require('exceljs/lib/utils/shared-formula.js') as { slideFormula: (formula: string, from: string, to: string) => string };

const DEFAULT_COLUMN_WIDTH = 9; // what exceljs gives a <col> without a width
const EXCEL_MAX_ROWS = 1_048_576;
const EXCEL_MAX_COLUMNS = 16_384;
const MS_PER_DAY = 86_400_000;

export interface SheetXml {
  xml: string;
  /** sheetData's content, [from, to); from === to when the sheet has none. */
  from: number;
  to: number;
}

export interface SheetLayout {
  columnWidths: Record<number, number>;
  frozenRows: number;
  frozenCols: number;
  merged: string[];
  mergeAreas: CellRange[];
  /** Cell address (as written) → link target, for links with a relationship (exceljs ignores the others). */
  links: Map<string, string>;
}

export interface CellContext {
  strings: string[];
  dateStyles: boolean[];
  date1904: boolean;
}

export function locateSheetData(xml: string): SheetXml {
  if (/<[A-Za-z_][\w.-]*:worksheet[\s>]/.test(xml.slice(0, 4096))) throw new NotDirect('a namespace prefix on the worksheet');
  const open = xml.indexOf('<sheetData');
  if (open === -1) return { xml, from: xml.length, to: xml.length };
  const gt = xml.indexOf('>', open);
  if (gt === -1) throw new NotDirect('an unterminated <sheetData>');
  if (xml[gt - 1] === '/') return { xml, from: gt, to: gt };
  const close = xml.indexOf('</sheetData>', gt);
  if (close === -1) throw new NotDirect('an unterminated <sheetData>');
  return { xml, from: gt + 1, to: close };
}

const whole = (text: string | undefined) => {
  const n = Number.parseInt(text || '0', 10);
  return Number.isInteger(n) && n > 0 ? n : 0;
};

export function readLayout(data: SheetXml, parts: Parts, entry: SheetEntry, maxColumns: number): SheetLayout {
  const { xml, from, to } = data;
  const headEnd = Math.min(from, xml.length);
  // Columns as exceljs's Column.fromModel lays them out: sorted by min, each <col> covering min..max.
  const columnWidths: Record<number, number> = {};
  const cols = tagsNamed(xml, 'col', 0, headEnd)
    .map((a) => ({ min: Number.parseInt(a.min || '0', 10), max: Number.parseInt(a.max || '0', 10), width: a.width === undefined ? DEFAULT_COLUMN_WIDTH : Number.parseFloat(a.width || '0') }))
    .sort((a, b) => a.min - b.min);
  let count = 1;
  for (const col of cols) {
    if (count < col.min) count = col.min;
    for (; count <= col.max; count++) {
      const i = count - 1;
      if (Number.isFinite(col.width) && col.width > 0 && i < maxColumns) columnWidths[i] = col.width;
    }
  }

  let frozenRows = 0;
  let frozenCols = 0;
  const head = xml.slice(0, headEnd);
  const views = /<sheetView[\s>/][^>]*?(\/?)>/g;
  for (let m = views.exec(head); m; m = views.exec(head)) {
    if (m[1] === '/') continue;
    const end = head.indexOf('</sheetView>', m.index);
    const pane = tagsNamed(head, 'pane', m.index, end === -1 ? headEnd : end)[0];
    if (pane && (pane.state === 'frozen' || pane.state === 'frozenSplit')) {
      frozenRows = whole(pane.ySplit);
      frozenCols = whole(pane.xSplit);
      break;
    }
  }

  const merged: string[] = [];
  const mergeAreas: CellRange[] = [];
  for (const m of tagsNamed(xml, 'mergeCell', to)) {
    const area = parseRangeName(m.ref ?? '');
    if (!area || m.ref.includes('!')) throw new NotDirect(`merged range ${m.ref}`);
    // exceljs refuses overlapping merges; the fallback says so.
    if (mergeAreas.some((a) => a.left <= area.right && area.left <= a.right && a.top <= area.bottom && area.top <= a.bottom)) throw new NotDirect('overlapping merged ranges');
    mergeAreas.push(area);
    merged.push(`${cellName(area.top, area.left)}:${cellName(area.bottom, area.right)}`);
  }

  const links = new Map<string, string>();
  const hyperlinks = tagsNamed(xml, 'hyperlink', to).filter((h) => h['r:id'] !== undefined);
  if (hyperlinks.length) {
    const rels = relationshipsOf(parts, `xl/worksheets/_rels/sheet${entry.partNumber}.xml.rels`);
    for (const h of hyperlinks) {
      const target = rels.get(h['r:id']);
      if (target === undefined) throw new NotDirect('a link without its relationship');
      if (h.ref !== undefined) links.set(h.ref, target);
    }
  }
  return { columnWidths, frozenRows, frozenCols, merged, mergeAreas, links };
}

function isNameEnd(code: number): boolean {
  return code === 62 /* > */ || code === 32 || code === 47 /* / */ || code === 9 || code === 10 || code === 13;
}

/** "AB12" → [row 11, col 27], or NotDirect. */
function decodeAddress(address: string): [number, number] {
  let col = 0;
  let i = 0;
  for (; i < address.length; i++) {
    const ch = address.charCodeAt(i);
    if (ch < 65 || ch > 90) break;
    col = col * 26 + (ch - 64);
  }
  const row = i > 0 && i <= 3 && i < address.length ? Number(address.slice(i)) : NaN;
  if (!Number.isInteger(row) || row < 1 || row > EXCEL_MAX_ROWS || col > EXCEL_MAX_COLUMNS || address.charCodeAt(i) === 43 /* + */) throw new NotDirect(`cell address ${address}`);
  return [row - 1, col - 1];
}

interface RawCell {
  address: string;
  t?: string;
  s?: string;
  f?: Record<string, string>;
  fText: string;
  v?: string;
  inline?: string;
}

/**
 * Reads sheetData's cells in order, handing each to `take` as a reading. Merged-over cells read as
 * 'merged', a linked cell as text with a note, as exceljs's model has them.
 */
export function scanCells(data: SheetXml, layout: SheetLayout, ctx: CellContext, take: (r: number, c: number, reading: CellReading) => void): void {
  const { xml, to } = data;
  const shared = new Map<string | undefined, { address: string; formula: string }>();
  // Merges that reach the current row, kept as the rows go by (cells come in row order).
  const merges = [...layout.mergeAreas].sort((a, b) => a.top - b.top);
  let nextMerge = 0;
  let active: CellRange[] = [];
  let lastRow = -1;
  let lastCol = -1;
  let i = data.from;
  const cell: RawCell = { address: '', fText: '' };
  for (;;) {
    const lt = xml.indexOf('<', i);
    if (lt === -1 || lt >= to) break;
    if (xml.charCodeAt(lt + 1) === 99 /* c */ && isNameEnd(xml.charCodeAt(lt + 2))) {
      i = readCell(xml, lt, to, cell);
      const [r, c] = decodeAddress(cell.address);
      if (r < lastRow || (r === lastRow && c <= lastCol)) throw new NotDirect('cells out of order');
      if (r !== lastRow) {
        while (nextMerge < merges.length && merges[nextMerge].top <= r) active.push(merges[nextMerge++]);
        if (active.length) active = active.filter((a) => a.bottom >= r);
      }
      lastRow = r;
      lastCol = c;
      if (active.length && active.some((a) => c >= a.left && c <= a.right && (r > a.top || c > a.left))) take(r, c, { kind: 'merged' });
      else take(r, c, readingOf(cell, shared, layout, ctx));
    } else if (xml.startsWith('<row', lt) && isNameEnd(xml.charCodeAt(lt + 4))) {
      i = xml.indexOf('>', lt) + 1;
    } else if (xml.startsWith('</row>', lt)) {
      i = lt + 6;
    } else throw new NotDirect(`markup ${xml.slice(lt, lt + 12)} in sheetData`);
  }
}

// The cell whose attributes are being read (one function for every cell, not a closure each).
let currentCell: RawCell;
function takeCellAttribute(name: string, value: string) {
  if (name === 'r') currentCell.address = value;
  else if (name === 't') currentCell.t = value;
  else if (name === 's') currentCell.s = value;
}

/** Reads the <c> element starting at `lt` into `cell` (reset first); returns where it ends. */
function readCell(xml: string, lt: number, to: number, cell: RawCell): number {
  const gt = xml.indexOf('>', lt);
  const empty = xml.charCodeAt(gt - 1) === 47;
  cell.address = '';
  cell.t = cell.s = cell.f = cell.v = cell.inline = undefined;
  cell.fText = '';
  currentCell = cell;
  eachAttribute(xml, lt + 2, empty ? gt - 1 : gt, takeCellAttribute);
  if (cell.address === '') throw new NotDirect('a cell without its address');
  if (empty) return gt + 1;
  let j = gt + 1;
  for (;;) {
    const at = xml.indexOf('<', j);
    if (at === -1 || at >= to) throw new NotDirect('an unterminated cell');
    const ch = xml.charCodeAt(at + 1);
    if (ch === 47 /* / */ && xml.startsWith('</c>', at)) return at + 4;
    const close = xml.indexOf('>', at);
    const selfClosing = xml.charCodeAt(close - 1) === 47;
    if ((ch === 118 /* v */ || ch === 102) /* f */ && isNameEnd(xml.charCodeAt(at + 2))) {
      const endTag = ch === 118 ? '</v>' : '</f>';
      let text = '';
      if (selfClosing) j = close + 1;
      else {
        const end = xml.indexOf(endTag, close);
        if (end === -1 || end > to) throw new NotDirect(`an unterminated ${endTag}`);
        text = textBetween(xml, close + 1, end);
        j = end + 4;
      }
      if (ch === 102) {
        if (cell.f) throw new NotDirect('a cell with two formulas');
        cell.f = attributesOf(xml, at + 2, selfClosing ? close - 1 : close);
        cell.fText = text;
      } else if (text !== '') {
        if (cell.v !== undefined) throw new NotDirect('a cell with two values');
        cell.v = text;
      }
    } else if (xml.startsWith('<is>', at)) {
      const end = xml.indexOf('</is>', at);
      if (end === -1 || end > to || cell.inline !== undefined) throw new NotDirect('an unterminated <is>');
      cell.inline = stringItemText(xml, at + 4, end);
      j = end + 5;
    } else throw new NotDirect(`markup ${xml.slice(at, at + 12)} in a cell`);
  }
}

function readingOf(cell: RawCell, shared: Map<string | undefined, { address: string; formula: string }>, layout: SheetLayout, ctx: CellContext): CellReading {
  const link = layout.links.size ? layout.links.get(cell.address) : undefined;
  const f = cell.f;
  if (f && (cell.fText || f.t)) {
    if (link !== undefined) throw new NotDirect('a link on a formula');
    let formula = cell.fText;
    if (f.t === 'shared') {
      if (f.ref) shared.set(f.si, { address: cell.address, formula });
      else if (!formula) {
        const master = shared.get(f.si);
        if (master && !master.formula) throw new NotDirect('a shared formula whose master has no text');
        formula = master ? slideFormula(master.formula, master.address, cell.address) : '';
      }
    }
    const text = cleanFormulaText(formula);
    if (!text) return { kind: 'skip', reason: 'formula text is missing (a shared formula whose master cell is gone)' };
    return { kind: 'formula', input: `=${text}`, arrayRef: f.t === 'array' && typeof f.ref === 'string' ? f.ref : undefined };
  }
  const v = cell.inline ?? cell.v;
  if (cell.inline !== undefined && cell.t !== 'inlineStr') throw new NotDirect('an inline string in a cell of another type');
  if (v === undefined) return link === undefined ? { kind: 'empty' } : linked('', link);
  switch (cell.t) {
    case 's': {
      const text = ctx.strings[Number.parseInt(v, 10)];
      if (text === undefined) throw new NotDirect('a shared string index past the table');
      if (link !== undefined) return linked(text, link);
      return text === '' ? { kind: 'empty' } : { kind: 'text', text };
    }
    case 'str':
    case 'inlineStr':
      if (link !== undefined) return linked(v, link);
      return v === '' ? { kind: 'empty' } : { kind: 'text', text: v };
    case 'b':
      if (link !== undefined) throw new NotDirect('a link on a boolean');
      return { kind: 'input', input: Number.parseInt(v, 10) !== 0 ? 'TRUE' : 'FALSE' };
    case 'e':
      if (link !== undefined) throw new NotDirect('a link on an error');
      return { kind: 'input', input: v };
    default: {
      // exceljs reads any other type (n, or none, or the rare d) as a number.
      const n = Number.parseFloat(v);
      const style = cell.s === undefined ? 0 : Number.parseInt(cell.s, 10);
      if (style && ctx.dateStyles[style]) {
        if (link !== undefined) throw new NotDirect('a link on a date');
        // exceljs's excelToDate: serial days from 1899-12-30 (or 1904-01-01) in UTC.
        const iso = dateInput(new Date(Math.round((n - 25569 + (ctx.date1904 ? 1462 : 0)) * MS_PER_DAY)));
        return iso === null ? { kind: 'skip', reason: 'date is not a valid calendar date' } : { kind: 'input', input: iso };
      }
      if (link !== undefined) return linked(String(n), link);
      const input = numberInput(n);
      return input === null ? { kind: 'skip', reason: `number ${String(n)} is not finite` } : { kind: 'input', input };
    }
  }
}

function linked(text: string, target: string): CellReading {
  return { kind: 'text', text: text || target, note: target ? `link target ${target} not kept` : undefined };
}
