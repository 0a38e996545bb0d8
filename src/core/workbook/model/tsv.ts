// Tab-separated text, the format desktop spreadsheet programs put on the clipboard (common practice):
// rows end with \n or \r\n, cells are separated by tabs, and a cell that holds a tab, a line break or
// a quote is wrapped in double quotes with inner quotes doubled (the CSV quoting rule of RFC 4180,
// applied with tabs).

/** Reads clipboard text into rows of cells; ragged rows are padded with '' to a rectangle. */
export function parseTsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let i = 0;
  const n = text.length;
  if (n === 0) return [['']];
  while (i <= n) {
    let cell: string;
    if (text[i] === '"') {
      const quoted = readQuoted(text, i);
      if (quoted) {
        cell = quoted.value;
        i = quoted.end;
      } else {
        // An opening quote that never closes is plain text (a cell like  "5" inches).
        const end = nextSeparator(text, i);
        cell = text.slice(i, end);
        i = end;
      }
    } else {
      const end = nextSeparator(text, i);
      cell = text.slice(i, end);
      i = end;
    }
    row.push(cell);
    if (i >= n) break;
    if (text[i] === '\t') {
      i += 1;
      if (i === n) row.push('');
      continue;
    }
    // A line break: \r\n, \n or a lone \r.
    i += text[i] === '\r' && text[i + 1] === '\n' ? 2 : 1;
    rows.push(row);
    row = [];
    if (i === n) break; // the usual trailing line break ends the last row; it does not start a new one
  }
  if (row.length > 0) rows.push(row);
  const width = Math.max(...rows.map((r) => r.length));
  return rows.map((r) => (r.length < width ? [...r, ...Array<string>(width - r.length).fill('')] : r));
}

function nextSeparator(text: string, from: number): number {
  for (let j = from; j < text.length; j++) {
    const c = text[j];
    if (c === '\t' || c === '\n' || c === '\r') return j;
  }
  return text.length;
}

/** A quoted cell starting at `start` (on the quote); null if it is not properly closed. */
function readQuoted(text: string, start: number): { value: string; end: number } | null {
  let value = '';
  let j = start + 1;
  while (j < text.length) {
    const c = text[j];
    if (c === '"') {
      if (text[j + 1] === '"') {
        value += '"';
        j += 2;
        continue;
      }
      const after = text[j + 1];
      if (after === undefined || after === '\t' || after === '\n' || after === '\r') return { value, end: j + 1 };
      return null; // a quote in the middle of a cell: not a quoted cell after all
    }
    value += c;
    j += 1;
  }
  return null;
}

/** Writes rows of cells as clipboard text other spreadsheet programs read back cell for cell. */
export function formatTsv(rows: readonly (readonly string[])[]): string {
  return rows.map((r) => r.map(quoteIfNeeded).join('\t')).join('\n');
}

function quoteIfNeeded(cell: string): string {
  return /[\t\n\r"]/.test(cell) ? `"${cell.replace(/"/g, '""')}"` : cell;
}
