// A1 naming and clipboard text, the two formats the grid shares with other spreadsheet programs.
import { describe, expect, it } from 'vitest';
import { cellAddress, cellKey, cellName, columnIndex, columnName, parseCellName, parseRangeName, rangeName, sheetReference } from '../shared/a1.js';
import { parseCellRange } from '../shared/cellRange.js';
import { formatTsv, parseTsv } from '../src/core/workbook/model/tsv.js';

describe('A1 column letters (common practice: A…Z, then AA…ZZ, then AAA)', () => {
  it('names the first, last single-letter and first two-letter columns', () => {
    expect(columnName(0)).toBe('A');
    expect(columnName(25)).toBe('Z');
    expect(columnName(26)).toBe('AA');
    expect(columnName(51)).toBe('AZ');
    expect(columnName(52)).toBe('BA');
  });

  it('rolls over from ZZ to AAA', () => {
    expect(columnName(701)).toBe('ZZ');
    expect(columnName(702)).toBe('AAA');
  });

  it('reads letters back to the same index for every column the engine allows', () => {
    for (let col = 0; col < 2000; col++) expect(columnIndex(columnName(col))).toBe(col);
  });

  it('refuses a negative or fractional column index', () => {
    expect(() => columnName(-1)).toThrow(/whole number/);
    expect(() => columnName(1.5)).toThrow(/whole number/);
  });

  it('names cells with rows counted from 1', () => {
    expect(cellName(0, 0)).toBe('A1');
    expect(cellName(9999, 27)).toBe('AB10000');
  });

  it('parses cell names, ignoring $ anchors and letter case', () => {
    expect(parseCellName('b3')).toEqual({ row: 2, col: 1 });
    expect(parseCellName('$AA$10')).toEqual({ row: 9, col: 26 });
    expect(parseCellName('A0')).toBeNull();
    expect(parseCellName('3B')).toBeNull();
  });

  it('normalises a range whose corners are given in any order', () => {
    expect(parseRangeName('C4:A1')).toEqual({ top: 0, left: 0, bottom: 3, right: 2 });
    expect(rangeName({ top: 3, left: 2, bottom: 0, right: 0 })).toBe('A1:C4');
    expect(rangeName({ top: 1, left: 1, bottom: 1, right: 1 })).toBe('B2');
    expect(parseRangeName('A1:B2:C3')).toBeNull();
  });

  it('quotes sheet names that are not plain identifiers, doubling inner apostrophes', () => {
    expect(sheetReference('Sheet1')).toBe('Sheet1');
    expect(sheetReference('Screening set')).toBe("'Screening set'");
    expect(sheetReference("Ana's ions")).toBe("'Ana''s ions'");
  });
});

describe('one A1 module for server, importers and grid', () => {
  it('reads column names of at most three letters everywhere (XFD, the last xlsx column, fits)', () => {
    expect(columnIndex('XFD')).toBe(16_383);
    expect([columnIndex('AAAA'), parseCellName('AAAA1'), parseRangeName('A1:AAAA2'), parseCellRange('AAAA1')]).toEqual([null, null, null, null]);
  });

  it('writes a cell address for messages with the sheet quoted as in formulas', () => {
    expect(cellAddress('Sheet1', 2, 1)).toBe('Sheet1!B3');
    expect(cellAddress("Ana's ions", 0, 27)).toBe("'Ana''s ions'!AB1");
  });

  it('keys cells so that no two cells share a key', () => {
    expect(cellKey({ sheetId: 's1', row: 1, col: 23 })).not.toBe(cellKey({ sheetId: 's1', row: 12, col: 3 }));
    expect(cellKey({ sheetId: 's1', row: 1, col: 2 })).toBe(cellKey({ sheetId: 's1', row: 1, col: 2 }));
  });
});

describe('tab-separated clipboard text', () => {
  it('reads rows and cells, ignoring the trailing line break spreadsheet programs add', () => {
    expect(parseTsv('O2\t=BONDORDER(A1)\nN2\t3\n')).toEqual([
      ['O2', '=BONDORDER(A1)'],
      ['N2', '3'],
    ]);
  });

  it('accepts Windows line endings', () => {
    expect(parseTsv('a\tb\r\nc\td\r\n')).toEqual([
      ['a', 'b'],
      ['c', 'd'],
    ]);
  });

  it('keeps tabs, line breaks and doubled quotes inside a quoted cell', () => {
    expect(parseTsv('"two\tparts"\t"line one\nline two"\t"say ""hi"""\nx\ty\tz')).toEqual([
      ['two\tparts', 'line one\nline two', 'say "hi"'],
      ['x', 'y', 'z'],
    ]);
  });

  it('treats a quote that does not close a cell as ordinary text', () => {
    expect(parseTsv('5" long\t"open\nnext')).toEqual([
      ['5" long', '"open'],
      ['next', ''],
    ]);
  });

  it('keeps empty cells, including a trailing empty cell and an empty middle row', () => {
    expect(parseTsv('a\t\tc\n\nd\t')).toEqual([
      ['a', '', 'c'],
      ['', '', ''],
      ['d', '', ''],
    ]);
  });

  it('pads ragged rows into a rectangle', () => {
    expect(parseTsv('a\nb\tc\td')).toEqual([
      ['a', '', ''],
      ['b', 'c', 'd'],
    ]);
  });

  it('quotes only the cells that need it when writing', () => {
    expect(formatTsv([['O2', 'line\nbreak'], ['tab\there', 'say "hi"']])).toBe('O2\t"line\nbreak"\n"tab\there"\t"say ""hi"""');
  });

  it('reads back exactly what it wrote', () => {
    const rows = [
      ['=MOCONFIG("O2")', '1.50', ''],
      ['multi\nline', 'quote " inside', 'tab\tinside'],
      ['', '', 'last'],
    ];
    expect(parseTsv(formatTsv(rows))).toEqual(rows);
  });
});
