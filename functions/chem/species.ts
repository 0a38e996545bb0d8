// Species notation: a diatomic molecule or ion written as text ("O2", "O2^2-", "CN-", "HeH+", "OH").
// Parsed once per distinct text and cached, because a screening column repeats the same species
// down thousands of rows. Every rejection is a ChemError whose message says what is wrong.
import { ChemError } from './errors.js';
import { elementBySymbol, isElementBeyondArgon, type Element } from './elements.js';
import { TextMemo } from './textMemo.js';

export interface Species {
  /** The text as the user typed it. */
  text: string;
  /** Canonical spelling, e.g. "O2^2-", "CN-", "HeH+". */
  formula: string;
  atoms: [Element, Element];
  homonuclear: boolean;
  charge: number;
  /** Electrons outside the atomic cores, after the charge. */
  valenceElectrons: number;
  /** All electrons, after the charge. */
  totalElectrons: number;
}

export const MAX_ABS_CHARGE = 3;

const SUBSCRIPT_DIGITS = '₀₁₂₃₄₅₆₇₈₉';
const SUPERSCRIPTS = '⁰¹²³⁴⁵⁶⁷⁸⁹⁺⁻';
const SUPERSCRIPT_ASCII = '0123456789+-';

/**
 * Accepts typographic input pasted from documents (O₂²⁻, O₂⁺, the minus sign U+2212) and a charge
 * set off by a space ("O2 2-" is O2^2-); other white space is ignored.
 */
function normalise(text: string): string {
  let out = '';
  let inSuperscript = false;
  for (const ch of text) {
    const sub = SUBSCRIPT_DIGITS.indexOf(ch);
    const sup = SUPERSCRIPTS.indexOf(ch);
    if (sup >= 0) {
      if (!inSuperscript) out += '^';
      inSuperscript = true;
      out += SUPERSCRIPT_ASCII[sup];
      continue;
    }
    inSuperscript = false;
    if (sub >= 0) out += String(sub);
    else if (ch === '\u2212' || ch === '\u2013') out += '-';
    else out += ch;
  }
  return out.trim().replace(/\s+(?=\d*[+-]+$)/, '^').replace(/\s+/g, '');
}

/** Reads the charge written after the formula: "", "+", "--", "^2-", "^-2", "(2-)", "(+)". */
function parseCharge(chargeText: string, original: string): number {
  if (chargeText === '') return 0;
  const signOf = (s: string) => (s === '+' ? 1 : -1);
  let m = /^\^?([+-])\1*$/.exec(chargeText);
  if (m) return signOf(m[1]) * chargeText.replace('^', '').length;
  m = /^\^(\d*)([+-])$/.exec(chargeText) ?? /^\((\d*)([+-])\)$/.exec(chargeText);
  if (m) return signOf(m[2]) * (m[1] === '' ? 1 : Number(m[1]));
  m = /^\^?([+-])(\d+)$/.exec(chargeText) ?? /^\(([+-])(\d+)\)$/.exec(chargeText);
  if (m) return signOf(m[1]) * Number(m[2]);
  throw new ChemError(`cannot read the charge '${chargeText}' in '${original}': write it as O2+, O2-, O2^2- or O2(2-)`);
}

function readAtoms(body: string, original: string, bareSignCharge: boolean): Element[] {
  if (body === '') throw new ChemError(`'${original}' has no element symbols: type a diatomic such as O2, NO+ or OH`);
  if (!/^[A-Z]/.test(body)) {
    throw new ChemError(`'${original}' is not a species: element symbols start with a capital letter (e.g. CO, NO, Cl2)`);
  }
  const atoms: Element[] = [];
  const token = /([A-Z][a-z]?)(\d*)/y;
  let at = 0;
  while (at < body.length) {
    token.lastIndex = at;
    const m = token.exec(body);
    if (!m) throw new ChemError(`'${original}' is not a species: unexpected '${body[at]}'`);
    const [, symbol, countText] = m;
    const element = elementBySymbol(symbol);
    if (!element) {
      if (isElementBeyondArgon(symbol)) {
        throw new ChemError(`element '${symbol}' in '${original}' is outside the supported range H to Ar`);
      }
      throw new ChemError(`unknown element '${symbol}' in '${original}'`);
    }
    const count = countText === '' ? 1 : Number(countText);
    if (count === 0) throw new ChemError(`'${original}' has a zero atom count after '${symbol}'`);
    if (count > 2 && bareSignCharge && m.index + m[0].length === body.length && countText.length > 1) {
      // "O22-" could mean O2 with charge 2− or 22 oxygen atoms with charge 1−: ask rather than guess.
      throw new ChemError(`'${original}' is ambiguous: write a multiple charge with ^ or brackets, e.g. O2^2- or O2(2-)`);
    }
    for (let i = 0; i < Math.min(count, 3); i++) atoms.push(element);
    at = token.lastIndex;
  }
  return atoms;
}

function formatCharge(charge: number): string {
  if (charge === 0) return '';
  const sign = charge > 0 ? '+' : '-';
  return Math.abs(charge) === 1 ? sign : `^${Math.abs(charge)}${sign}`;
}

function atomCount(body: string): number {
  let n = 0;
  for (const m of body.matchAll(/[A-Z][a-z]?(\d*)/g)) n += m[1] === '' ? 1 : Number(m[1]);
  return n;
}

/** "CN2-" reads as C + N2 with charge 1−; if the user meant CN with charge 2−, say how to write it. */
function chargeHint(body: string, chargeText: string): string {
  const m = /^(.*?)(\d+)$/.exec(body);
  if (!m || !/^[+-]$/.test(chargeText) || atomCount(m[1]) !== 2) return '';
  return ` (for a charge of ${m[2]}${chargeText} write ${m[1]}^${m[2]}${chargeText})`;
}

function parseUncached(original: string): Species {
  const text = normalise(original);
  if (text === '') throw new ChemError('species is empty: type a diatomic such as O2, NO+ or OH');
  if (/^[+-]?\d+(\.\d+)?$/.test(text)) {
    throw new ChemError(`'${original}' is a number, not a species: type a diatomic such as O2, NO+ or OH`);
  }
  const chargeStart = text.search(/[\^(+-]/);
  const body = chargeStart < 0 ? text : text.slice(0, chargeStart);
  const chargeText = chargeStart < 0 ? '' : text.slice(chargeStart);
  const bareSign = /^[+-]$/.test(chargeText);
  const atoms = readAtoms(body, original, bareSign);
  if (atoms.length !== 2) {
    const n = atomCount(body);
    const hint = chargeHint(body, chargeText);
    throw new ChemError(`only diatomic species are supported: '${original}' has ${n} atom${n === 1 ? '' : 's'}${hint}`);
  }
  const charge = parseCharge(chargeText, original);
  const [a, b] = atoms as [Element, Element];
  const totalElectrons = a.atomicNumber + b.atomicNumber - charge;
  const chargeLabel = `${charge > 0 ? '+' : ''}${charge}`;
  if (totalElectrons <= 0) throw new ChemError(`charge ${chargeLabel} leaves no electrons in '${original}'`);
  if (Math.abs(charge) > MAX_ABS_CHARGE) {
    throw new ChemError(`charge ${chargeLabel} in '${original}' is outside the supported range -${MAX_ABS_CHARGE} to +${MAX_ABS_CHARGE}`);
  }
  const valenceElectrons = a.valenceElectrons + b.valenceElectrons - charge;
  if (valenceElectrons <= 0) throw new ChemError(`charge ${chargeLabel} leaves no valence electrons in '${original}'`);
  const homonuclear = a === b;
  return {
    text: original,
    formula: (homonuclear ? `${a.symbol}2` : `${a.symbol}${b.symbol}`) + formatCharge(charge),
    atoms: [a, b],
    homonuclear,
    charge,
    valenceElectrons,
    totalElectrons,
  };
}

// Bounded, and remembers rejections as well as species (see textMemo.ts).
const parsed = new TextMemo<Species>(20_000);

/** Parses a species (cached per distinct text). Throws ChemError with a message naming the problem. */
export function parseSpecies(text: string): Species {
  return parsed.get(text, () => parseUncached(text));
}

/** How many texts were actually parsed (cache misses) since the last reset: for tests and benchmarks. */
export function speciesParseCount(): number {
  return parsed.misses;
}

export function clearSpeciesCache(): void {
  parsed.clear();
}
