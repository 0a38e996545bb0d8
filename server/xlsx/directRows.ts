// A worksheet's rows written straight into exceljs's streaming worksheet as the XML exceljs itself
// would write for them, without its per-cell objects. For each cell exceljs makes a Cell, a value
// object, a model copied from it, and an XmlStream of small strings joined at the end; for 100,000
// cells that, and the garbage it leaves, was most of an export's time. Here a row becomes one string.
//
// The text is exceljs 4.4's own (pinned): lib/xlsx/xform/sheet/row-xform.js and cell-xform.js, the
// row's commit in lib/stream/xlsx/worksheet-writer.js (_writeRow). Styles and shared strings go
// through exceljs's own tables, in the order its commit registers them, so the ids match too.
// tests/xlsx-direct-rows.test.ts writes workbooks both ways and compares every part of the files.
//
// Only what the export writes is taken here: numbers, text, booleans, errors, dates, and formulas
// (with an array range or none) caching one of those. A row with a note, a sheet with column styles,
// or rows exceljs still holds (a merge reaches them) go through exceljs as before (`ready`).
import { createRequire } from 'node:module';
import ExcelJS from 'exceljs';

const require = createRequire(import.meta.url);
const { xmlEncode, dateToExcel } = require('exceljs/lib/utils/utils.js') as { xmlEncode: (text: string) => string; dateToExcel: (d: Date, date1904?: boolean) => number };
const colCache = require('exceljs/lib/utils/col-cache.js') as { n2l: (n: number) => string };

const T = ExcelJS.ValueType;

/** The parts of exceljs's streaming worksheet this uses (worksheet-writer.js). */
interface WorksheetWriterInternals {
  _rows: unknown[];
  _rowZero: number;
  startedData: boolean;
  useSharedStrings: boolean;
  stream: { write(text: string): unknown };
  _writeColumns(): void;
  _writeOpenSheetData(): void;
  _workbook: {
    styles: { addStyleModel(style: object, cellType?: number): number };
    sharedStrings: { add(text: string): number };
  };
}

type Formula = { formula: string; result?: ExcelJS.CellValue; shareType?: 'array'; ref?: string };
/** A cell's value as the export gives it to exceljs: a scalar, or a formula caching one. */
export type DirectValue = number | string | boolean | Date | { error: string } | Formula | null | undefined;

/** Whether `value` is one this writes as exceljs would (otherwise its row goes through exceljs). */
export function directWritable(value: unknown): boolean {
  if (value === null || value === undefined || typeof value === 'string' || typeof value === 'number' || typeof value === 'boolean' || value instanceof Date) return true;
  const v = value as Partial<Formula> & { error?: unknown };
  if (typeof v.formula === 'string') {
    // exceljs takes an empty formula for some other kind of value.
    if (!v.formula || (v.shareType !== undefined && v.shareType !== 'array')) return false;
    const r = v.result;
    return r === null || r === undefined || typeof r === 'string' || typeof r === 'number' || typeof r === 'boolean' || r instanceof Date || (typeof r === 'object' && typeof (r as { error?: unknown }).error === 'string' && (r as { error: string }).error !== '');
  }
  return Object.keys(v).length === 1 && typeof v.error === 'string' && v.error !== '';
}

/** exceljs's type of a plain value (Value.getType, cell-xform.js getValueType). */
function scalarType(v: unknown): number {
  if (v === null || v === undefined) return T.Null;
  if (typeof v === 'string') return T.String;
  if (typeof v === 'number') return T.Number;
  if (typeof v === 'boolean') return T.Boolean;
  if (v instanceof Date) return T.Date;
  if ((v as Formula).formula) return T.Formula;
  if ((v as { error?: string }).error) return T.Error;
  throw new Error('directRows: a value exceljs would not write as a cell');
}

/**
 * The type exceljs's Cell.effectiveType reports once the value is set: a formula's is its result's,
 * except that a boolean or error result counts as Null there (doc/cell.js FormulaValue).
 */
export function effectiveTypeOf(value: DirectValue): number {
  const type = scalarType(value);
  if (type !== T.Formula) return type;
  const result = (value as Formula).result;
  const r = scalarType(result);
  return r === T.String || r === T.Number || r === T.Date ? r : T.Null;
}

/** The row's style as exceljs's Row has it ({}), one object so its style id is looked up once. */
const ROW_STYLE = Object.freeze({});

export class DirectRows {
  private readonly ws: WorksheetWriterInternals;
  private cols: number[] = [];
  private values: DirectValue[] = [];
  private styles: object[] = [];

  private constructor(ws: WorksheetWriterInternals) {
    this.ws = ws;
  }

  /** For exceljs's streaming worksheet `ws`, or null when its internals are not the ones this writes into. */
  static for(ws: ExcelJS.Worksheet): DirectRows | null {
    const w = ws as unknown as Partial<WorksheetWriterInternals>;
    const ok =
      Array.isArray(w._rows) &&
      typeof w._rowZero === 'number' &&
      typeof w.startedData === 'boolean' &&
      typeof w._writeColumns === 'function' &&
      typeof w._writeOpenSheetData === 'function' &&
      typeof w.stream?.write === 'function' &&
      typeof w._workbook?.styles?.addStyleModel === 'function' &&
      (!w.useSharedStrings || typeof w._workbook?.sharedStrings?.add === 'function');
    return ok ? new DirectRows(w as WorksheetWriterInternals) : null;
  }

  /** Whether a row can be written here now: exceljs holds no uncommitted row (a merge makes some ahead). */
  get ready(): boolean {
    return this.ws._rows.length === 0;
  }

  /** Adds a cell (1-based column, in increasing order) to the row being put together. */
  cell(col: number, value: DirectValue, style: object): void {
    this.cols.push(col);
    this.values.push(value);
    this.styles.push(style);
  }

  /** Writes the row put together (1-based number) as exceljs's commit would, and starts the next. */
  endRow(rowNumber: number): void {
    const { cols, values, styles } = this;
    this.cols = [];
    this.values = [];
    this.styles = [];
    const ws = this.ws;
    // Row numbers ahead of this one are for exceljs's own rows (worksheet-writer.js _commitRow).
    ws._rowZero = rowNumber + 1;
    // Row.hasValues: a row of empty cells is not written at all (and registers nothing).
    if (!values.some((v) => v !== null && v !== undefined)) return;
    if (!ws.startedData) {
      ws._writeColumns();
      ws._writeOpenSheetData();
      ws.startedData = true;
    }
    const { styles: styleTable, sharedStrings } = ws._workbook;
    const shared = ws.useSharedStrings ? sharedStrings : null;
    // row-xform.js prepare, then render: the row's style first, then each cell's.
    const rowStyleId = styleTable.addStyleModel(ROW_STYLE);
    let xml = `<row r="${rowNumber}"`;
    const min = cols[0];
    const max = cols[cols.length - 1];
    if (min > 0 && max > 0 && min <= max) xml += ` spans="${min}:${max}"`;
    if (rowStyleId) xml += ` s="${rowStyleId}" customFormat="1"`;
    xml += ' x14ac:dyDescent="0.25">';
    for (let i = 0; i < cols.length; i++) xml += this.cellXml(cols[i], rowNumber, values[i], styles[i], styleTable, shared);
    ws.stream.write(xml + '</row>');
  }

  /** cell-xform.js prepare + render for one cell. */
  private cellXml(
    col: number,
    rowNumber: number,
    value: DirectValue,
    style: object,
    styleTable: WorksheetWriterInternals['_workbook']['styles'],
    shared: WorksheetWriterInternals['_workbook']['sharedStrings'] | null,
  ): string {
    const type = scalarType(value);
    const formula = type === T.Formula ? (value as Formula) : null;
    const valueType = formula ? scalarType(formula.result) : type;
    const styleId = styleTable.addStyleModel(style, valueType);
    const ssId = type === T.String && shared ? shared.add(value as string) : undefined;
    if (type === T.Null && !styleId) return '';
    let xml = `<c r="${colCache.n2l(col)}${rowNumber}"`;
    if (styleId) xml += ` s="${styleId}"`;
    switch (type) {
      case T.Null:
        return xml + '/>';
      case T.Number:
        return `${xml}><v>${xmlEncode(String(value))}</v></c>`;
      case T.Boolean:
        return `${xml} t="b"><v>${value ? '1' : '0'}</v></c>`;
      case T.Error:
        return `${xml} t="e"><v>${xmlEncode(String((value as { error: string }).error))}</v></c>`;
      case T.String:
        return ssId !== undefined ? `${xml} t="s"><v>${ssId}</v></c>` : `${xml} t="str"><v>${xmlEncode(value as string)}</v></c>`;
      case T.Date:
        return `${xml}><v>${dateToExcel(value as Date)}</v></c>`;
      default:
        return `${xml}${formulaXml(formula!, valueType)}</c>`;
    }
  }
}

/** cell-xform.js renderFormula: the type attribute (on <c>), then <f> and the cached <v>. */
function formulaXml(model: Formula, resultType: number): string {
  let f = '<f';
  if (model.shareType === 'array') {
    f += ' t="array"';
    if (model.ref !== undefined) f += ` ref="${xmlEncode(String(model.ref))}"`;
  }
  f += `>${xmlEncode(model.formula)}</f>`;
  const result = model.result;
  switch (resultType) {
    case T.Null:
      return `>${f}`;
    case T.String:
      return ` t="str">${f}<v>${xmlEncode(result as string)}</v>`;
    case T.Number:
      return `>${f}<v>${xmlEncode(String(result))}</v>`;
    case T.Boolean:
      return ` t="b">${f}<v>${result ? 1 : 0}</v>`;
    case T.Error:
      return ` t="e">${f}<v>${xmlEncode(String((result as { error: string }).error))}</v>`;
    case T.Date:
      return `>${f}<v>${dateToExcel(result as Date)}</v>`;
    default:
      throw new Error('directRows: a formula result exceljs would not write');
  }
}
