// What one grid cell shows for a plain value (a number, text, a boolean or nothing): the part of
// cellView.ts the page's first script needs to draw stored values (src/app/earlyGlance.ts) before the
// formula engine's code has arrived, so it imports nothing of the engine's. Pure.

export type CellKind = 'number' | 'text' | 'boolean' | 'error' | 'empty' | 'pending';

export interface CellView {
  /** What is stored and edited ('' for a cell filled by a neighbouring array formula). */
  input: string;
  /** The computed value as the grid shows it. */
  display: string;
  kind: CellKind;
  /** The raw value, for charts, sorting and filters. */
  value: number | string | boolean | null;
  /** For errors: the code shown in the cell (#VALUE!) and the message shown on hover/selection. */
  errorCode?: string;
  errorMessage?: string;
  /** Filled by an array formula in another cell: shown, not editable. */
  spilled?: boolean;
  /** Not editable for another reason (role, lock, protected range), with the reason to show. */
  readOnlyReason?: string;
}

/** Decimal places for numbers, or null for the automatic ("general") format. */
export type Precision = number | null;

/**
 * The automatic format: whole numbers as they are, others to 6 significant digits with trailing zeros
 * dropped (as many as a computed bond order, energy or wavelength is worth reading, and what fits a
 * column), and scientific notation for very large or very small magnitudes. The full value stays in
 * the cell: charts, sorting and the formula bar's tooltip use it.
 */
export function formatNumber(x: number, precision: Precision): string {
  if (!Number.isFinite(x)) return String(x);
  const abs = Math.abs(x);
  if (precision !== null) {
    const places = Math.max(0, Math.min(15, Math.round(precision)));
    if (abs >= 1e15) return x.toExponential(places);
    const text = x.toFixed(places);
    // A tiny negative rounding residue (e.g. -1e-16) would otherwise show as "-0.000".
    return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text;
  }
  if (x === 0) return '0';
  if (abs >= 1e11 || abs < 1e-4) return trimExponential(x.toExponential(5));
  if (Number.isInteger(x)) return String(x);
  const text = x.toPrecision(6);
  return text.includes('e') ? trimExponential(text) : trimFraction(text);
}

function trimFraction(s: string): string {
  return s.includes('.') ? s.replace(/\.?0+$/, '') : s;
}

function trimExponential(s: string): string {
  const [mantissa, exponent] = s.split('e');
  return `${trimFraction(mantissa)}E${exponent.startsWith('-') || exponent.startsWith('+') ? exponent : `+${exponent}`}`;
}

/** What a plain value shows; undefined for an empty cell (no input, no value). */
export function valueView(input: string, value: number | string | boolean | null | undefined, precision: Precision, spilled = false): CellView | undefined {
  if (value === null || value === undefined) {
    if (input === '') return undefined;
    // A formula that evaluates to an empty reference shows nothing but keeps its input.
    return { input, display: '', kind: 'empty', value: null, spilled };
  }
  if (typeof value === 'number') return { input, display: formatNumber(value, precision), kind: 'number', value, spilled };
  if (typeof value === 'boolean') return { input, display: value ? 'TRUE' : 'FALSE', kind: 'boolean', value, spilled };
  return { input, display: value, kind: 'text', value, spilled };
}

/** One row of cell views by column index (a row with nothing in it is EMPTY_ROW, shared). */
export type RowData = Readonly<Record<string, CellView | undefined>>;
export const EMPTY_ROW: RowData = Object.freeze({});
