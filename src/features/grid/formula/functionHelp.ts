// Function help for autocomplete: our catalog's functions (signature and summary from
// functions/help.ts, the same text as the function reference page) and the engine's built-ins
// (signature from the engine's own parameter metadata). Matching is pure so it is tested without
// a browser.
import { HyperFormula } from 'hyperformula';
import { functionHelp, type FunctionHelp as CatalogHelp, type ParamHelp } from '@functions/help.js';
import { builtInSummaries } from './builtInSummaries.js';

export interface FunctionHelp {
  name: string;
  /** e.g. BONDORDER(species, [ordering]) */
  signature: string;
  summary: string;
  origin: 'orbitab' | 'built-in';
  /** Each parameter as the signature writes it (optional ones in brackets), and ours in full. */
  params: string[];
  paramHelp?: ParamHelp[];
  /** The last parameter repeats (SUM(value, …)). */
  repeats?: boolean;
}

export function catalogEntryHelp(h: CatalogHelp): FunctionHelp {
  const unit = h.returns.unit ? ` (${h.returns.unit})` : '';
  return {
    name: h.name,
    signature: h.signature,
    summary: `${h.summary.replace(/\.$/, '')}${unit}.`,
    origin: 'orbitab',
    params: h.params.map((p) => (p.optional ? `[${p.name}]` : p.name)),
    paramHelp: h.params,
  };
}

const argumentWords: Record<string, string> = {
  NUMBER: 'number',
  INTEGER: 'integer',
  STRING: 'text',
  BOOLEAN: 'logical',
  RANGE: 'range',
  NOERROR: 'value',
  SCALAR: 'value',
  ANY: 'value',
  COMPLEX: 'complex',
};

/** A built-in's signature from the engine's metadata: argument kinds, optional ones in brackets. */
export function builtInHelp(name: string): FunctionHelp {
  const meta = (HyperFormula.getFunctionPlugin(name) as unknown as { implementedFunctions?: Record<string, { parameters?: { argumentType: string; defaultValue?: unknown; optionalArg?: boolean }[]; repeatLastArgs?: number }> } | undefined)?.implementedFunctions?.[name];
  const params = (meta?.parameters ?? []).map((p) => {
    const word = argumentWords[p.argumentType] ?? 'value';
    return p.defaultValue !== undefined || p.optionalArg ? `[${word}]` : word;
  });
  const signatureParams = meta?.repeatLastArgs ? [...params, '…'] : params;
  return { name, signature: `${name}(${signatureParams.join(', ')})`, summary: builtInSummaries[name] ?? 'Built-in spreadsheet function.', origin: 'built-in', params, repeats: !!meta?.repeatLastArgs };
}

export interface ArgumentHint {
  name: string;
  params: string[];
  /** Which of `params` the caret is in, or -1 past the last one (too many arguments). */
  current: number;
  /** The current parameter in words: its description, unit, default and choices (ours only). */
  detail: string | null;
}

/** The hint shown while typing argument `index` of function `name`, or null for an unknown name. */
export function argumentHint(name: string, index: number, list: readonly FunctionHelp[] = allFunctionHelp()): ArgumentHint | null {
  const h = list.find((f) => f.name === name);
  if (!h || h.params.length === 0) return null;
  const current = index < h.params.length ? index : h.repeats ? h.params.length - 1 : -1;
  const p = current >= 0 ? h.paramHelp?.[current] : undefined;
  let detail: string | null = null;
  if (p) {
    const parts = [p.description.replace(/\.$/, '')];
    if (p.unit) parts.push(`in ${p.unit}`);
    if (p.default !== undefined) parts.push(`default ${typeof p.default === 'string' ? `"${p.default}"` : String(p.default)}`);
    if (p.choices?.length) parts.push(`one of ${p.choices.map((c) => `"${c}"`).join(', ')}`);
    detail = parts.join('; ');
  } else if (current === -1) detail = `${name} takes at most ${h.params.length} argument${h.params.length === 1 ? '' : 's'}`;
  return { name: h.name, params: h.params, current, detail };
}

let cached: FunctionHelp[] | null = null;

/** Every function a formula can call: ours first, then the built-ins, each alphabetically. */
export function allFunctionHelp(): FunctionHelp[] {
  if (cached) return cached;
  const ours = functionHelp().map(catalogEntryHelp).sort((a, b) => a.name.localeCompare(b.name));
  const ourNames = new Set(ours.map((h) => h.name));
  const builtIns = HyperFormula.getRegisteredFunctionNames('enGB')
    .filter((n) => !ourNames.has(n))
    .sort()
    .map(builtInHelp);
  cached = [...ours, ...builtIns];
  return cached;
}

export interface FunctionToken {
  /** Where the partial name starts and ends in the formula text. */
  start: number;
  end: number;
  prefix: string;
}

/**
 * The partial function name being typed at the caret, or null: only in a formula, not inside a
 * quoted string, not after a sheet name ("Sheet1!A") and not when it already reads as a cell (B12).
 */
export function functionTokenAt(text: string, caret: number): FunctionToken | null {
  if (!text.startsWith('=') || caret < 2) return null;
  const before = text.slice(0, caret);
  if ((before.match(/"/g)?.length ?? 0) % 2 === 1) return null;
  const m = /([A-Za-z][A-Za-z0-9_.]*)$/.exec(before);
  if (!m) return null;
  const start = caret - m[1].length;
  const preceding = text[start - 1];
  if (preceding === '!' || preceding === '$' || preceding === "'" || /[A-Za-z0-9_]/.test(preceding ?? '')) return null;
  if (/^[A-Za-z]{1,3}[0-9]+$/.test(m[1])) return null;
  let end = caret;
  while (end < text.length && /[A-Za-z0-9_.]/.test(text[end])) end++;
  return { start, end, prefix: m[1] };
}

/** Functions whose name starts with the prefix (case-insensitive), ours first. */
export function suggestFunctions(prefix: string, list: readonly FunctionHelp[], limit = 8): FunctionHelp[] {
  const p = prefix.toUpperCase();
  return list.filter((h) => h.name.startsWith(p)).slice(0, limit);
}

/** The formula with the partial name replaced by NAME( and the caret just inside the bracket. */
export function acceptSuggestion(text: string, token: FunctionToken, name: string): { text: string; caret: number } {
  const hasBracket = text[token.end] === '(';
  const inserted = hasBracket ? name : `${name}(`;
  return { text: text.slice(0, token.start) + inserted + text.slice(token.end), caret: token.start + inserted.length + (hasBracket ? 1 : 0) };
}
