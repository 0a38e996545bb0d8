// Cell triples in the shape that crosses a worker boundary cheaply. Posting 100,000 [row, col, input]
// arrays serialises and rebuilds 100,000 small objects (about 90 ms for the benchmark's workbook, with
// v8.serialize/deserialize); packed, three typed arrays (transferred, not copied) and one string take
// about 45 ms including packing and unpacking.
import type { CellTriple, ExportWorkbook, ParsedWorkbook } from './types.js';

export interface PackedCells {
  rows: Uint32Array;
  cols: Uint32Array;
  /** Length of each input in UTF-16 code units, in order; `text` is all of them concatenated. */
  lengths: Uint32Array;
  text: string;
}

export function packCells(cells: readonly CellTriple[]): PackedCells {
  const n = cells.length;
  const rows = new Uint32Array(n);
  const cols = new Uint32Array(n);
  const lengths = new Uint32Array(n);
  const inputs: string[] = new Array(n);
  for (let i = 0; i < n; i++) {
    const [row, col, input] = cells[i];
    rows[i] = row;
    cols[i] = col;
    lengths[i] = input.length;
    inputs[i] = input;
  }
  return { rows, cols, lengths, text: inputs.join('') };
}

/** Cells packed between turns of the event loop. */
const PACK_SLICE = 32_768;

/**
 * packCells a slice at a time with a turn of the event loop between slices: packing 800,000 cells
 * at once holds the thread for over half a second.
 */
export async function packCellsInSlices(cells: readonly CellTriple[], turn: () => Promise<void>): Promise<PackedCells> {
  const n = cells.length;
  const rows = new Uint32Array(n);
  const cols = new Uint32Array(n);
  const lengths = new Uint32Array(n);
  const texts: string[] = [];
  for (let from = 0; from < n; from += PACK_SLICE) {
    const to = Math.min(n, from + PACK_SLICE);
    const inputs: string[] = new Array(to - from);
    for (let i = from; i < to; i++) {
      const [row, col, input] = cells[i];
      rows[i] = row;
      cols[i] = col;
      lengths[i] = input.length;
      inputs[i - from] = input;
    }
    texts.push(inputs.join(''));
    if (to < n) await turn();
  }
  return { rows, cols, lengths, text: texts.join('') };
}

export function unpackCells(packed: PackedCells): CellTriple[] {
  return unpackCellsFrom(packed, 0, 0, packed.rows.length).cells;
}

/**
 * Cells `from`..`to` (exclusive), the first one's input starting at character `at` of the text:
 * a large batch is unpacked a step at a time, so no turn of the event loop makes all its cells.
 */
export function unpackCellsFrom(packed: PackedCells, from: number, at: number, to: number): { cells: CellTriple[]; at: number } {
  const { rows, cols, lengths, text } = packed;
  const end = Math.min(to, rows.length);
  const cells: CellTriple[] = new Array(Math.max(0, end - from));
  for (let i = from; i < end; i++) {
    const stop = at + lengths[i];
    cells[i - from] = [rows[i], cols[i], text.slice(at, stop)];
    at = stop;
  }
  return { cells, at };
}

/** The buffers to list as transferables when posting `packed`. */
export function packedTransfer(packed: PackedCells): ArrayBuffer[] {
  return [packed.rows.buffer as ArrayBuffer, packed.cols.buffer as ArrayBuffer, packed.lengths.buffer as ArrayBuffer];
}

type WithPackedCells<S> = Omit<S, 'cells'> & { packed: PackedCells };
export type PackedExportWorkbook = Omit<ExportWorkbook, 'sheets'> & { sheets: WithPackedCells<ExportWorkbook['sheets'][number]>[] };
export type PackedParsedWorkbook = Omit<ParsedWorkbook, 'sheets'> & { sheets: WithPackedCells<ParsedWorkbook['sheets'][number]>[] };

/** A workbook (export or parsed) with each sheet's cells packed, and the buffers to transfer. */
export function packSheets<W extends { sheets: { cells: CellTriple[] }[] }>(workbook: W): { packed: Omit<W, 'sheets'> & { sheets: (Omit<W['sheets'][number], 'cells'> & { packed: PackedCells })[] }; transfer: ArrayBuffer[] } {
  const transfer: ArrayBuffer[] = [];
  const sheets = workbook.sheets.map(({ cells, ...rest }) => {
    const packed = packCells(cells);
    transfer.push(...packedTransfer(packed));
    return { ...rest, packed };
  });
  return { packed: { ...workbook, sheets } as never, transfer };
}

export function unpackSheets<W extends { sheets: { packed: PackedCells }[] }>(workbook: W): Omit<W, 'sheets'> & { sheets: (Omit<W['sheets'][number], 'packed'> & { cells: CellTriple[] })[] } {
  return { ...workbook, sheets: workbook.sheets.map(({ packed, ...rest }) => ({ ...rest, cells: unpackCells(packed) })) } as never;
}
