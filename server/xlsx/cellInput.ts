// One exceljs cell → the input a user would type in Orbitab. Dates become ISO-8601 text
// ("2024-03-01", or "2024-03-01T14:30:00" with a time), read in UTC as exceljs gives them; the
// writer turns such text back into real dates, so a round trip is exact. A time of day alone
// (serial below 1, which exceljs dates 1899-12-30) becomes "14:30:00", which the engine reads as a time.
import ExcelJS from 'exceljs';

export type CellReading =
  | { kind: 'empty' }
  | { kind: 'merged' }
  | { kind: 'input'; input: string }
  | { kind: 'text'; text: string; note?: string }
  | { kind: 'formula'; input: string; arrayRef?: string }
  | { kind: 'skip'; reason: string };

const { ValueType } = ExcelJS;

export function isoDateText(date: Date): string | null {
  if (Number.isNaN(date.getTime())) return null;
  const iso = date.toISOString();
  if (iso.endsWith('T00:00:00.000Z')) return iso.slice(0, 10);
  return iso.endsWith('.000Z') ? iso.slice(0, 19) : iso.slice(0, 23);
}

const SERIAL_ZERO_MS = Date.UTC(1899, 11, 30);
const MS_PER_DAY = 86_400_000;

/** The input for a date cell: ISO date(-time) text, or hh:mm:ss for a time of day alone. */
export function dateInput(date: Date): string | null {
  const ms = date.getTime();
  if (Number.isNaN(ms)) return null;
  if (ms >= SERIAL_ZERO_MS && ms < SERIAL_ZERO_MS + MS_PER_DAY) {
    const iso = date.toISOString();
    return iso.endsWith('.000Z') ? iso.slice(11, 19) : iso.slice(11, 23);
  }
  return isoDateText(date);
}

export function numberInput(n: number): string | null {
  if (!Number.isFinite(n)) return null;
  return Object.is(n, -0) ? '0' : String(n);
}

/** Files written by Excel prefix newer functions (`_xlfn.CONCAT`); the engine knows them by plain name. */
export function cleanFormulaText(formula: string): string {
  if (!/_xl/i.test(formula)) return formula.trim();
  let out = '';
  let inString = false;
  for (let i = 0; i < formula.length; i++) {
    const ch = formula[i];
    if (ch === '"') inString = !inString;
    if (!inString && ch === '_') {
      const m = /^_xl(?:fn|ws|udf)\./i.exec(formula.slice(i, i + 7));
      if (m) {
        i += m[0].length - 1;
        continue;
      }
    }
    out += ch;
  }
  return out.trim();
}

function richTextOf(value: unknown): string | null {
  const rich = (value as { richText?: { text: string }[] } | null)?.richText;
  return Array.isArray(rich) ? rich.map((r) => r.text ?? '').join('') : null;
}

/**
 * A formula cell's stored model. exceljs's public `value` getter copies it into a new object on every
 * read (40,000 copies for a screening sheet); the model is read in place instead (exceljs 4.4, pinned).
 */
function formulaModel(cell: ExcelJS.Cell): { shareType?: string; ref?: unknown } {
  const model = (cell as unknown as { _value?: { model?: { shareType?: string; ref?: unknown } } })._value?.model;
  return model ?? (cell.value as { shareType?: string; ref?: unknown });
}

export function readCell(cell: ExcelJS.Cell): CellReading {
  const type = cell.type;
  const value = type === ValueType.Formula ? null : (cell.value as any);
  switch (type) {
    case ValueType.Null:
      return { kind: 'empty' };
    case ValueType.Merge:
      return { kind: 'merged' };
    case ValueType.Number: {
      const input = numberInput(value);
      return input === null ? { kind: 'skip', reason: `number ${String(value)} is not finite` } : { kind: 'input', input };
    }
    case ValueType.Boolean:
      return { kind: 'input', input: value ? 'TRUE' : 'FALSE' };
    case ValueType.Date: {
      const iso = dateInput(value);
      return iso === null ? { kind: 'skip', reason: 'date is not a valid calendar date' } : { kind: 'input', input: iso };
    }
    case ValueType.String:
      return value === '' ? { kind: 'empty' } : { kind: 'text', text: value };
    case ValueType.RichText: {
      const text = richTextOf(value) ?? '';
      return text === '' ? { kind: 'empty' } : { kind: 'text', text };
    }
    case ValueType.Hyperlink: {
      const text = richTextOf(value.text) ?? String(value.text ?? '');
      const target = String(value.hyperlink ?? '');
      return { kind: 'text', text: text || target, note: target ? `link target ${target} not kept` : undefined };
    }
    case ValueType.Error:
      // The literal (#N/A, #DIV/0!, …) is an error value in the engine too.
      return { kind: 'input', input: String(value?.error ?? '#VALUE!') };
    case ValueType.Formula: {
      const formula = cleanFormulaText(String(cell.formula ?? ''));
      if (!formula) return { kind: 'skip', reason: 'formula text is missing (a shared formula whose master cell is gone)' };
      const model = formulaModel(cell);
      const arrayRef = model.shareType === 'array' && typeof model.ref === 'string' ? model.ref : undefined;
      return { kind: 'formula', input: `=${formula}`, arrayRef };
    }
    default:
      return { kind: 'skip', reason: `cell type ${String(type)} is not supported` };
  }
}
