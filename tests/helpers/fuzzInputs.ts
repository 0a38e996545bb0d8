// Seeded random cell inputs for fuzz tests: formulas with Orbitab's functions and odd arguments,
// species-like text, unicode, control characters and long text. Same seed, same inputs, so a
// failure reproduces (the seed is in the test name).
import { catalog } from '../../functions/catalog/index.js';
import type { ParamSpec } from '../../functions/catalog/types.js';
import { maxFormulaNesting } from '../../shared/cellInput.js';
import { maxInputLength } from '../../shared/workbooks.js';
import { seededRandom as plainSeededRandom } from './seededRandom.js';

/** The seeded generator (helpers/seededRandom.ts) with the picks fuzz inputs are made of. */
export function seededRandom(seed: number) {
  const next = plainSeededRandom(seed);
  const int = (lo: number, hi: number) => lo + Math.floor(next() * (hi - lo + 1));
  const pick = <T>(items: readonly T[]): T => items[Math.floor(next() * items.length)];
  const chance = (p: number) => next() < p;
  return { next, int, pick, chance };
}
export type Random = ReturnType<typeof seededRandom>;

const knownSpecies = ['O2', 'O2-', 'O2^2-', 'O2+', 'NO', 'NO+', 'NO-', 'CO', 'CN-', 'CN', 'N2', 'N2+', 'F2', 'C2', 'B2', 'He2+', 'H2', 'OH', 'CH', 'NH', 'HF', 'Li2', 'Ne2'];
const oddSpecies = ['Xq2', '', ' ', 'O', 'o2', 'O2^99-', 'O2²⁻', '(NO)2', 'N2++', 'N2+-', 'U2', 'H', 'HHHHHH', 'O2^-', '2O', 'N₂', 'NaCl', 'Fe2', '🧪', 'O2\u0000'];
const smiles = ['c1ccccc1', 'C=CC=C', 'C=CC=CC=C', 'C1=CC=CC=C1', '[CH2+]C=C', 'c1ccc2ccccc2c1', 'O=C1C=CC(=O)C=C1', 'c1ccncc1', 'C1=CC=C1', 'c1cc[nH]c1', 'C=C', 'CC', 'C#CC#C'];
const smilesAlphabet = 'cCnNoOsS=#()[]+-@H123456789.';
const numbers = [0, -0, 1, -1, 2, 0.5, 3.14159, 1e15, -1e15, 1e308, -1e308, 1e-320, 137, 1e6, 0.0001];
const words = ['abc', '1,5', 'TRUE', 'true', '', ' ', '#N/A', 'eV', 'EV', 'kj/mol', '💥', 'nan', 'Infinity', '-'];

function escapeText(text: string) {
  return `"${text.replace(/"/g, '""')}"`;
}

function speciesText(r: Random): string {
  if (r.chance(0.55)) return r.pick(knownSpecies);
  if (r.chance(0.5)) return r.pick(oddSpecies);
  const elements = ['H', 'He', 'Li', 'B', 'C', 'N', 'O', 'F', 'Ne', 'Na', 'Cl', 'S', 'P', 'Xx', 'Zz'];
  const charge = r.pick(['', '+', '-', '2+', '2-', '^2-', '^3+', '^-', '^10+']);
  return `${r.pick(elements)}${r.chance(0.6) ? r.int(0, 3) || '' : r.pick(elements)}${charge}`;
}

function smilesText(r: Random): string {
  if (r.chance(0.6)) return r.pick(smiles);
  const length = r.chance(0.9) ? r.int(1, 30) : r.int(30, 120);
  return Array.from({ length }, () => r.pick([...smilesAlphabet])).join('');
}

function numberText(r: Random): string {
  if (r.chance(0.7)) return String(r.pick(numbers));
  if (r.chance(0.5)) return (r.next() * 10 ** r.int(-5, 5) * (r.chance(0.3) ? -1 : 1)).toPrecision(r.int(1, 15));
  return escapeText(r.pick(words));
}

function reference(r: Random): string {
  const col = String.fromCharCode(65 + r.int(0, 9));
  if (r.chance(0.2)) return `${col}${r.int(1, 40)}:${String.fromCharCode(65 + r.int(0, 9))}${r.int(1, 40)}`;
  if (r.chance(0.1)) return r.pick(['Sheet1!A1', "'No such sheet'!A1", 'XFD1048576', 'A0', 'ZZZ1']);
  return `${col}${r.int(1, 40)}`;
}

function inlineArray(r: Random): string {
  const n = r.int(1, 5);
  const rows = Array.from({ length: n }, () => Array.from({ length: r.chance(0.9) ? n : r.int(1, 6) }, () => (r.chance(0.9) ? r.int(-2, 2) : r.pick(['"x"', 'TRUE']))).join(','));
  return `{${rows.join(';')}}`;
}

function argument(r: Random, spec: ParamSpec | undefined, depth: number): string {
  if (r.chance(0.08)) return reference(r);
  if (depth < 2 && r.chance(0.05)) return formulaBody(r, depth + 1);
  if (!spec || r.chance(0.07)) return r.pick([numberText(r), escapeText(speciesText(r)), '', 'TRUE']);
  if (spec.choices && r.chance(0.75)) {
    const choice = r.pick(spec.choices);
    return escapeText(r.chance(0.2) ? choice.toUpperCase() : choice);
  }
  switch (spec.type) {
    case 'number':
    case 'integer':
      return r.chance(0.9) ? numberText(r) : r.int(-3, 60).toString();
    case 'range':
      if (r.chance(0.25)) return inlineArray(r);
      return escapeText(r.chance(0.7) ? smilesText(r) : speciesText(r));
    case 'boolean':
      return r.pick(['TRUE', 'FALSE', '0', '1', '"yes"']);
    default:
      return escapeText(spec.type === 'any' ? speciesText(r) : r.chance(0.5) ? r.pick(words) : speciesText(r));
  }
}

function formulaBody(r: Random, depth = 0): string {
  const entry = r.pick(catalog);
  const required = entry.params.filter((p) => !p.optional).length;
  // Mostly a sensible count, sometimes too few or too many.
  const count = r.chance(0.85) ? r.int(required, entry.params.length) : r.int(0, entry.params.length + 2);
  const args = Array.from({ length: count }, (_, i) => argument(r, entry.params[i], depth));
  const name = r.chance(0.1) ? entry.name.toLowerCase() : entry.name;
  return `${name}(${args.join(',')})`;
}

/** A formula using one of our functions, sometimes wrapped, nested or broken off part-way. */
export function formula(r: Random): string {
  let body = formulaBody(r);
  if (r.chance(0.15)) body = r.pick([`1+${body}`, `IFERROR(${body},"x")`, `${body}&"!"`, `-${body}`, `${body}/0`, `SUM(${body})`]);
  const text = `=${body}`;
  return r.chance(0.08) ? text.slice(0, r.int(1, text.length)) : text;
}

function codePointText(r: Random, length: number): string {
  const ranges: [number, number][] = [
    [0x20, 0x7e], // ASCII
    [0x370, 0x3ff], // Greek (σ, π)
    [0x300, 0x36f], // combining marks
    [0x590, 0x6ff], // Hebrew and Arabic (right to left)
    [0x2070, 0x209f], // super- and subscripts (O₂²⁻)
    [0x4e00, 0x4fff], // CJK
    [0x1f300, 0x1faff], // emoji
    [0x200b, 0x200f], // zero-width and direction marks
    [0xfeff, 0xfeff], // byte order mark
  ];
  let out = '';
  for (let i = 0; i < length; i++) {
    const [lo, hi] = r.pick(ranges);
    out += String.fromCodePoint(r.int(lo, hi));
    if (r.chance(0.03)) out += '\u200d'; // joiner, as in emoji sequences
  }
  return out;
}

/** Any kind of input a person (or a paste, or a script) might put in a cell, up to the length cap. */
export function cellInput(r: Random): string {
  const kind = r.next();
  if (kind < 0.45) return formula(r);
  if (kind < 0.55) return speciesText(r);
  if (kind < 0.62) return smilesText(r);
  if (kind < 0.75) return codePointText(r, r.int(1, 40));
  if (kind < 0.78) return Array.from({ length: r.int(1, 20) }, () => String.fromCharCode(r.pick([r.int(0, 31), 127, r.int(32, 126)]))).join('');
  if (kind < 0.8) {
    // What a broken client or script might send; shared/cellInput.ts refuses these.
    const lone = `${codePointText(r, r.int(0, 5))}${r.pick(['\ud800', '\udbff', '\udc00', '\udfff'])}${codePointText(r, r.int(0, 5))}`;
    const deep = r.int(maxFormulaNesting + 1, 300);
    return r.pick([lone, `=${'('.repeat(deep)}1${')'.repeat(deep)}`, `${r.int(1, 9)}e${r.int(309, 999)}`]);
  }
  if (kind < 0.9) {
    const length = r.chance(0.3) ? maxInputLength : r.int(1000, maxInputLength);
    if (r.chance(0.5)) return `="${'n'.repeat(length - 3)}"`;
    const unit = codePointText(r, 1); // one or two UTF-16 units; never cut a pair in half
    return unit.repeat(Math.floor(length / unit.length));
  }
  const depth = r.int(1, maxFormulaNesting);
  return r.pick(['=', '==', '=(', '=((', `=${'('.repeat(depth)}1${')'.repeat(depth)}`, '=A1', '=1/0', '=#REF!', '="', "'=BONDORDER(\"O2\")", '=LAMBDA(x,x)(1)', '=BONDORDER(', '=HUCKEL("', '   ', '=-', '+-', '=SUM(A1:A40)']);
}
