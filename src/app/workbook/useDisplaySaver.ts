// Display settings (widths, frozen header, precision) are shown at once and saved on the sheet after
// a short pause, so they follow the workbook. On a sheet I only view they stay on this screen: a
// viewer may read with other decimals or a frozen header without asking anyone or seeing an error.
import { useCallback, useRef } from 'react';
import type { DisplaySettings } from '../../core/workbook/model/displaySettings.js';
import { saveDisplaySettings } from '../../core/workbook/api.js';
import type { WorkbookSession } from '../../core/workbook/session/useWorkbookSession.js';

export function useDisplaySaver(session: WorkbookSession, sheetId: string, say: (message: string) => void, keepLocal: () => boolean = () => false) {
  const saveTimer = useRef<ReturnType<typeof setTimeout> | null>(null);
  return useCallback(
    (next: DisplaySettings) => {
      session.model.setDisplay(sheetId, next);
      if (saveTimer.current) clearTimeout(saveTimer.current);
      if (keepLocal()) return;
      saveTimer.current = setTimeout(() => saveDisplaySettings(session, sheetId, next).catch((e: Error) => say(`Display settings not saved: ${e.message}`)), 500);
    },
    [session, sheetId, say, keepLocal],
  );
}
