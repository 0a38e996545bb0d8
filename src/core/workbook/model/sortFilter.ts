// Sorting a block of rows by one column and filtering the rows shown, on plain values so the rules
// can be tested without a browser. The order follows what desktop spreadsheets do (common practice):
// ascending puts numbers first (by value), then text (case-insensitive, natural digits), then
// FALSE before TRUE, then errors; empty cells stay at the bottom in both directions; ties keep
// their original order (a stable sort), so sorting twice by two columns nests as people expect.

export type SortValue = number | string | boolean | null | { error: string };
export type SortDirection = 'ascending' | 'descending';

const collator = new Intl.Collator('en', { sensitivity: 'base', numeric: true });

function rank(v: SortValue): number {
  if (typeof v === 'number') return 0;
  if (typeof v === 'string') return 1;
  if (typeof v === 'boolean') return 2;
  return 3; // errors
}

function isEmpty(v: SortValue): boolean {
  return v === null || v === '';
}

/** Compares two non-empty values in ascending order. */
export function compareAscending(a: SortValue, b: SortValue): number {
  const ra = rank(a);
  const rb = rank(b);
  if (ra !== rb) return ra - rb;
  if (typeof a === 'number' && typeof b === 'number') return a - b;
  if (typeof a === 'string' && typeof b === 'string') return collator.compare(a, b);
  if (typeof a === 'boolean' && typeof b === 'boolean') return Number(a) - Number(b);
  return collator.compare((a as { error: string }).error, (b as { error: string }).error);
}

/**
 * The new order of rows: result[i] is the index (into `keys`) of the row that goes to position i.
 */
export function sortPermutation(keys: readonly SortValue[], direction: SortDirection): number[] {
  const sign = direction === 'ascending' ? 1 : -1;
  const filled: number[] = [];
  const empty: number[] = [];
  keys.forEach((k, i) => (isEmpty(k) ? empty : filled).push(i));
  // Array.prototype.sort is stable (ES2019), which keeps ties in their original order.
  filled.sort((i, j) => sign * compareAscending(keys[i], keys[j]));
  return [...filled, ...empty];
}

export type FilterCriterion = { kind: 'equals'; text: string } | { kind: 'contains'; text: string };

/** Whether a cell's displayed text passes the filter; comparisons ignore case and outer spaces. */
export function matchesFilter(displayed: string, criterion: FilterCriterion): boolean {
  const cell = displayed.trim().toLocaleLowerCase();
  const wanted = criterion.text.trim().toLocaleLowerCase();
  return criterion.kind === 'equals' ? cell === wanted : cell.includes(wanted);
}

/** Row indices from `first` to `last` (inclusive) whose cell passes the filter. */
export function filterRows(first: number, last: number, displayedAt: (row: number) => string, criterion: FilterCriterion): number[] {
  const kept: number[] = [];
  for (let row = first; row <= last; row++) if (matchesFilter(displayedAt(row), criterion)) kept.push(row);
  return kept;
}

/** The distinct displayed values of a column with their counts, most frequent first (for the filter menu). */
export function distinctValues(displayed: Iterable<string>, limit = 200): { text: string; count: number }[] {
  const counts = new Map<string, { text: string; count: number }>();
  for (const d of displayed) {
    const key = d.trim().toLocaleLowerCase();
    const entry = counts.get(key);
    if (entry) entry.count += 1;
    else counts.set(key, { text: d.trim(), count: 1 });
  }
  return [...counts.values()].sort((a, b) => b.count - a.count || collator.compare(a.text, b.text)).slice(0, limit);
}

/**
 * Whether the first row of a block reads as a header over its data (text over numbers): every filled
 * cell of the first row is text, and in at least one column where it is, most filled cells below are
 * numbers. A column of species names under "Species" cannot tell either way on its own, which is why
 * a number column is needed (common practice in desktop spreadsheets' sort dialogs).
 */
export function looksLikeHeader(rows: readonly (readonly SortValue[])[]): boolean {
  if (rows.length < 2) return false;
  const [first, ...below] = rows;
  const filled = first.filter((v) => !isEmpty(v));
  if (filled.length === 0 || filled.some((v) => typeof v !== 'string')) return false;
  return first.some((v, col) => {
    if (typeof v !== 'string' || isEmpty(v)) return false;
    const column = below.map((r) => r[col] ?? null).filter((x) => !isEmpty(x));
    return column.length > 0 && column.filter((x) => typeof x === 'number').length * 2 > column.length;
  });
}
