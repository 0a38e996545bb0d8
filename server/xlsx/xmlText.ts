// The little XML the direct reader needs: a start tag's attributes, a text node's entities, and the
// way out when a part is shaped in a way it does not read. Spreadsheet parts are machine-written and
// regular, so plain string scanning reads them several times faster than a general SAX parser
// (measured: saxes alone over the benchmark's 5 MB sheet takes about as long as exceljs's whole
// load). Anything irregular — a comment, CDATA, an unknown entity, a namespace prefix — is not
// guessed at: the reader gives up with NotDirect and the file is read by exceljs instead.

/** The direct reader does not read this file (or this part of it); readXlsx falls back to exceljs. */
export class NotDirect extends Error {
  constructor(reason: string) {
    super(reason);
    this.name = 'NotDirect';
  }
}

const NAMED: Record<string, string> = { lt: '<', gt: '>', amp: '&', quot: '"', apos: "'" };

/** Replaces XML's five named entities and character references (XML 1.0 §4.1, §4.6). */
export function decodeEntities(text: string): string {
  if (text.indexOf('&') === -1) return text;
  return text.replace(/&([^;&]{0,10});/g, (whole, name: string) => {
    if (name[0] === '#') {
      const code = name[1] === 'x' ? Number.parseInt(name.slice(2), 16) : Number.parseInt(name.slice(1), 10);
      if (!Number.isInteger(code) || code < 0 || code > 0x10ffff || !/^#(?:x[0-9a-fA-F]+|[0-9]+)$/.test(name)) throw new NotDirect(`character reference ${whole}`);
      return String.fromCodePoint(code);
    }
    const named = NAMED[name];
    if (named === undefined) throw new NotDirect(`entity ${whole}`);
    return named;
  });
}

/**
 * Text content between a start tag and its end tag (`from`, `to` exclusive): entities decoded.
 * Markup inside (a comment, CDATA, a child element) is not read directly.
 */
export function textBetween(xml: string, from: number, to: number): string {
  const raw = xml.slice(from, to);
  if (raw.indexOf('<') !== -1) throw new NotDirect('markup inside a text node');
  return decodeEntities(raw);
}

/** ST_Xstring's escapes for characters XML cannot hold: `_x000D_` → carriage return (ECMA-376 Part 1, §22.9.2.19 — from memory). */
export function decodeXstring(text: string): string {
  return text.indexOf('_x') === -1 ? text : text.replace(/_x([0-9A-F]{4})_/g, (_, hex: string) => String.fromCharCode(Number.parseInt(hex, 16)));
}

/** Attributes of the start tag whose text (name excluded) runs from `from` to `to`. */
export function attributesOf(xml: string, from: number, to: number): Record<string, string> {
  const out: Record<string, string> = {};
  eachAttribute(xml, from, to, (name, value) => (out[name] = value));
  return out;
}

/** Calls `take` with each attribute of the start tag whose text (name excluded) runs from `from` to `to`. */
export function eachAttribute(xml: string, from: number, to: number, take: (name: string, value: string) => void): void {
  let i = from;
  while (i < to) {
    const c = xml.charCodeAt(i);
    // Whitespace or the '/' of an empty-element tag.
    if (c === 32 || c === 9 || c === 10 || c === 13 || c === 47) {
      i++;
      continue;
    }
    const eq = xml.indexOf('=', i);
    if (eq === -1 || eq >= to) throw new NotDirect('an attribute without a value');
    const name = xml.slice(i, eq).trim();
    let q = eq + 1;
    while (q < to && (xml.charCodeAt(q) === 32 || xml.charCodeAt(q) === 9 || xml.charCodeAt(q) === 10 || xml.charCodeAt(q) === 13)) q++;
    const quote = xml[q];
    if (quote !== '"' && quote !== "'") throw new NotDirect('an unquoted attribute');
    const end = xml.indexOf(quote, q + 1);
    if (end === -1 || end >= to) throw new NotDirect('an unterminated attribute');
    const value = xml.slice(q + 1, end);
    if (value.indexOf('<') !== -1) throw new NotDirect('"<" inside an attribute');
    take(name, decodeEntities(value));
    i = end + 1;
  }
}

/** Every start (or empty-element) tag named `name` in xml[from, to): its attributes, in order. */
export function tagsNamed(xml: string, name: string, from = 0, to = xml.length): Record<string, string>[] {
  const found: Record<string, string>[] = [];
  const open = `<${name}`;
  for (let at = xml.indexOf(open, from); at !== -1 && at < to; at = xml.indexOf(open, at + open.length)) {
    const next = xml.charCodeAt(at + open.length);
    // <sheet …> but not <sheets>: the name must end here.
    if (next !== 32 && next !== 9 && next !== 10 && next !== 13 && next !== 47 && next !== 62) continue;
    const gt = xml.indexOf('>', at);
    if (gt === -1) throw new NotDirect(`an unterminated <${name}> tag`);
    found.push(attributesOf(xml, at + open.length, gt));
  }
  return found;
}

/** The text of the first element `name` (its first text node only; nested markup is not read directly), or undefined. */
export function elementText(xml: string, name: string): string | undefined {
  const re = new RegExp(`<${name.replace(/[.:]/g, '\\$&')}(?:\\s[^>]*)?(/?)>`);
  const m = re.exec(xml);
  if (!m) return undefined;
  if (m[1] === '/') return '';
  const start = m.index + m[0].length;
  const end = xml.indexOf(`</${name}>`, start);
  if (end === -1) throw new NotDirect(`an unterminated <${name}>`);
  return textBetween(xml, start, end);
}

/** The part as text; only UTF-8 parts are read directly (the declaration may name another encoding). */
export function partText(bytes: Buffer): string {
  const head = bytes.subarray(0, 200).toString('latin1');
  const declared = /^(?:\uFEFF|ï»¿)?<\?xml[^>]*encoding\s*=\s*["']([^"']+)["']/.exec(head)?.[1];
  if (declared && !/^utf-?8$/i.test(declared)) throw new NotDirect(`a part in ${declared}`);
  if (bytes[0] === 0xfe || bytes[0] === 0xff) throw new NotDirect('a part in UTF-16');
  const text = bytes.toString('utf8');
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}
