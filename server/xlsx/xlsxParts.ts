// The workbook-wide parts the direct reader needs besides the sheets: the sheet list (names,
// visibility, which part holds each), the 1904 date flag, which cell styles show dates, the shared
// strings and the file's author. Each reads a part the way exceljs 4.4 (pinned) reads it, so a file
// imports the same by either reader; where exceljs would refuse the file or read it oddly, NotDirect
// hands the file to exceljs itself.
import { createRequire } from 'node:module';
import { decodeXstring, elementText, NotDirect, partText, tagsNamed, textBetween } from './xmlText.js';

const require = createRequire(import.meta.url);
// exceljs's own table of built-in number formats (ECMA-376 Part 1, §18.8.30), so a style counts as
// a date exactly when exceljs would count it one.
const builtInFormats = require('exceljs/lib/xlsx/defaultnumformats.js') as Record<string, { f?: string }>;

export type Parts = ReadonlyMap<string, Buffer>;

export interface SheetEntry {
  name: string;
  state?: string;
  /** The worksheet part, e.g. xl/worksheets/sheet2.xml, and the number in its name (its rels part follows it). */
  part: string;
  partNumber: string;
}

export interface WorkbookInfo {
  sheets: SheetEntry[];
  date1904: boolean;
  creator?: string;
}

/** exceljs's test for a date format: y, m, d, h, s or b outside quotes and brackets. */
export function isDateFormat(format: string | undefined): boolean {
  if (!format) return false;
  return /[ymdhMsb]+/.test(format.replace(/\[[^\]]*]/g, '').replace(/"[^"]*"/g, ''));
}

/** Relationship id → target, of a .rels part (absent part: none). */
export function relationshipsOf(parts: Parts, name: string): Map<string, string> {
  const bytes = parts.get(name);
  const map = new Map<string, string>();
  if (!bytes) return map;
  for (const rel of tagsNamed(partText(bytes), 'Relationship')) {
    if (rel.Id !== undefined && rel.Target !== undefined) map.set(rel.Id, rel.Target);
  }
  return map;
}

// exceljs reads a part as a worksheet when its name matches this (anywhere in the name).
const WORKSHEET_PART = /xl\/worksheets\/sheet(\d+)[.]xml/;
const SHEET_NAME_REFUSED = /[*?:/\\[\]]|^'|'$/;

export function readWorkbookInfo(parts: Parts): WorkbookInfo {
  const xml = partText(parts.get('xl/workbook.xml')!);
  if (/<[A-Za-z_][\w.-]*:workbook[\s>]/.test(xml)) throw new NotDirect('a namespace prefix on the workbook');
  const rels = relationshipsOf(parts, 'xl/_rels/workbook.xml.rels');
  const sheets: SheetEntry[] = [];
  const names = new Set<string>();
  const claimed = new Set<string>();
  const sheetsFrom = xml.indexOf('<sheets');
  const sheetsTo = xml.indexOf('</sheets>', sheetsFrom);
  for (const s of sheetsFrom === -1 ? [] : tagsNamed(xml, 'sheet', sheetsFrom, sheetsTo === -1 ? xml.length : sheetsTo)) {
    const target = s['r:id'] === undefined ? undefined : rels.get(s['r:id']);
    if (target === undefined) throw new NotDirect('a sheet without its relationship');
    const part = `xl/${target.replace(/^(\s|\/xl\/)+/, '')}`;
    const number = /^xl\/worksheets\/sheet(\d+)\.xml$/.exec(part)?.[1];
    if (number === undefined || !parts.has(part) || claimed.has(part)) throw new NotDirect(`sheet part ${part}`);
    // exceljs refuses these names (or shortens them); the fallback says so in its own words.
    const name = s.name ?? '';
    if (!name || name === 'History' || name.length > 31 || SHEET_NAME_REFUSED.test(name) || names.has(name.toLowerCase())) throw new NotDirect(`sheet name "${name}"`);
    names.add(name.toLowerCase());
    claimed.add(part);
    sheets.push({ name, state: s.state, part, partNumber: number });
  }
  // A worksheet part no sheet names (exceljs reads and drops it) or a chart sheet: read by exceljs.
  for (const name of parts.keys()) if (WORKSHEET_PART.test(name) && !claimed.has(name)) throw new NotDirect(`unlisted worksheet part ${name}`);
  const pr = tagsNamed(xml, 'workbookPr')[0];
  return { sheets, date1904: pr?.date1904 === '1', creator: creatorOf(parts) };
}

function creatorOf(parts: Parts): string | undefined {
  const core = parts.get('docProps/core.xml');
  return core ? elementText(partText(core), 'dc:creator') : undefined;
}

/** For each cell style index (the s attribute), whether exceljs would read its numbers as dates. */
export function readDateStyles(parts: Parts): boolean[] {
  const bytes = parts.get('xl/styles.xml');
  if (!bytes) return [];
  const xml = partText(bytes);
  const formats = new Map<number, string>();
  for (const f of tagsNamed(xml, 'numFmt')) {
    if (f.formatCode === undefined) throw new NotDirect('a number format without its code');
    formats.set(Number.parseInt(f.numFmtId, 10), f.formatCode.replace(/[\\](.)/g, '$1'));
  }
  const from = xml.indexOf('<cellXfs');
  if (from === -1) return [];
  const to = xml.indexOf('</cellXfs>', from);
  return tagsNamed(xml, 'xf', from, to === -1 ? xml.length : to).map((xf) => {
    const id = Number.parseInt(xf.numFmtId, 10);
    return Boolean(id) && isDateFormat(formats.get(id) || builtInFormats[id]?.f);
  });
}

/**
 * One string item (<si>, or a cell's <is>) from `from` to `to`: its text, rich-text runs joined;
 * phonetic guides (<rPh>) are not part of the text.
 */
export function stringItemText(xml: string, from: number, to: number): string {
  let text = '';
  let plain = 0;
  let i = from;
  for (;;) {
    const lt = xml.indexOf('<', i);
    if (lt === -1 || lt >= to) break;
    if (xml.startsWith('<t', lt) && (xml[lt + 2] === '>' || xml[lt + 2] === ' ' || xml[lt + 2] === '/')) {
      const gt = xml.indexOf('>', lt);
      if (xml[gt - 1] === '/') {
        i = gt + 1;
        plain++;
        continue;
      }
      const end = xml.indexOf('</t>', gt);
      if (end === -1 || end > to) throw new NotDirect('an unterminated <t>');
      text += decodeXstring(textBetween(xml, gt + 1, end));
      plain++;
      i = end + 4;
    } else if (xml.startsWith('<r>', lt) || xml.startsWith('</r>', lt) || xml.startsWith('<rPr', lt)) {
      // A run: its <t> is read by the branch above; its formatting is skipped.
      if (xml.startsWith('<rPr', lt)) {
        const gt = xml.indexOf('>', lt);
        const end = xml[gt - 1] === '/' ? gt : xml.indexOf('</rPr>', gt);
        if (end === -1 || end > to) throw new NotDirect('an unterminated <rPr>');
        i = end + 1;
      } else i = lt + 3;
      plain = -Infinity; // runs: every <t> joins
    } else if (xml.startsWith('<rPh', lt)) {
      const end = xml.indexOf('</rPh>', lt);
      if (end === -1 || end > to) throw new NotDirect('an unterminated <rPh>');
      i = end + 6;
    } else if (xml.startsWith('<phoneticPr', lt)) {
      i = xml.indexOf('>', lt) + 1;
    } else throw new NotDirect(`markup ${xml.slice(lt, lt + 12)} in a string`);
  }
  // exceljs keeps only the last of several bare <t> in one item; such items go to it.
  if (plain > 1) throw new NotDirect('a string item with several texts');
  return text;
}

export function readSharedStrings(parts: Parts): string[] {
  const bytes = parts.get('xl/sharedStrings.xml');
  if (!bytes) return [];
  const xml = partText(bytes);
  const strings: string[] = [];
  for (let at = xml.indexOf('<si', 0); at !== -1; ) {
    const gt = xml.indexOf('>', at);
    if (xml[gt - 1] === '/') throw new NotDirect('an empty string item');
    const end = xml.indexOf('</si>', gt);
    if (end === -1) throw new NotDirect('an unterminated <si>');
    strings.push(stringItemText(xml, gt + 1, end));
    at = xml.indexOf('<si', end);
  }
  return strings;
}
