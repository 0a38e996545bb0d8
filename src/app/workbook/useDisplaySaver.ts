// Display settings (widths, frozen header, precision) are shown at once and saved on the sheet after
// a short pause, so they follow the workbook. On a sheet I only view they stay on this screen: a
// viewer may read with other decimals or a frozen header without asking anyone or seeing an error.
// While a save waits, settings revisions from the live stream are held back (model/displaySaves.ts).
import { useCallback, useRef } from 'react';
import type { DisplaySettings } from '../../core/workbook/model/displaySettings.js';
import { saveDisplaySettings } from '../../core/workbook/api.js';
import type { WorkbookSession } from '../../core/workbook/session/useWorkbookSession.js';

export function useDisplaySaver(session: WorkbookSession, sheetId: string, say: (message: string) => void, keepLocal: () => boolean = () => false) {
  // One waiting save per sheet: a quick change on another tab must not cancel this one.
  const timers = useRef(new Map<string, ReturnType<typeof setTimeout>>());
  return useCallback(
    (next: DisplaySettings) => {
      const { model } = session;
      model.setDisplay(sheetId, next);
      const waiting = timers.current.get(sheetId);
      if (waiting !== undefined) clearTimeout(waiting);
      if (keepLocal()) {
        if (waiting !== undefined) {
          timers.current.delete(sheetId);
          model.displaySaves.end(sheetId, null); // nothing sent; my screen keeps what it shows
        }
        return;
      }
      // A save not sent yet is replaced by this one, in its place among the waiting saves.
      if (waiting === undefined) model.displaySaves.begin(sheetId);
      const settle = (revision: number | null) => {
        const later = model.displaySaves.end(sheetId, revision);
        if (later && model.hasSheet(sheetId)) model.setDisplay(sheetId, later);
      };
      timers.current.set(
        sheetId,
        setTimeout(() => {
          timers.current.delete(sheetId);
          saveDisplaySettings(session, sheetId, next).then(settle, (e: Error) => {
            say(`Display settings not saved: ${e.message}`);
            settle(null);
          });
        }, 500),
      );
    },
    [session, sheetId, say, keepLocal],
  );
}
