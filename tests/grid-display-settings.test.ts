// A sheet's display settings as the grid reads and saves them. The server replaces the whole settings
// object on each save, so what the grid does not manage itself (an import's frozen panes and merged
// ranges, which the export writes back into the file) must come back out of the grid unchanged.
import { describe, expect, it } from 'vitest';
import { fileLayoutOf, settingsFromParsed } from '../server/xlsx/sheetSettings.js';
import { readDisplaySettings, writeDisplaySettings } from '../src/core/workbook/model/displaySettings.js';

/** Settings exactly as an .xlsx import stores them: two frozen rows, one frozen column, a merged title. */
const imported = settingsFromParsed({ name: 'Ions', cells: [], columnWidths: { 0: 20 }, frozenRows: 2, frozenCols: 1, merged: ['A1:C1'] }, []);

describe('sheet display settings', () => {
  it('keeps an import’s frozen panes and merged ranges when the grid saves a new precision and width', () => {
    const display = readDisplaySettings(imported);
    const saved = writeDisplaySettings({ ...display, precision: 3, columnWidths: { ...display.columnWidths, 1: 150 } });
    expect(saved).toMatchObject({ frozenRows: 2, frozenCols: 1, merged: ['A1:C1'], precision: 3, freezeHeaderRow: true });
    // The export reads them back: the file gets its frozen panes and merged title again.
    expect(fileLayoutOf(saved)).toMatchObject({ frozenRows: 2, frozenCols: 1, merged: ['A1:C1'] });
  });

  it('falls back on malformed fields of its own and keeps any other field as it was', () => {
    const display = readDisplaySettings({ precision: 'two', freezeHeaderRow: 'yes', columnWidths: { 0: 'wide', 2: 9999 }, note: 'kept as is' });
    expect(display).toMatchObject({ precision: null, freezeHeaderRow: false, columnWidths: { 2: 800 } });
    expect(writeDisplaySettings({ ...display, freezeHeaderRow: true })).toEqual({ note: 'kept as is', columnWidths: { 2: 800 }, freezeHeaderRow: true, precision: null });
  });
});
