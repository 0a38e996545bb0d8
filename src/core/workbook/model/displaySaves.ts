// Display settings of mine on their way to the server, per sheet. A save replaces the sheet's whole
// settings object, so a settings revision that arrives over the live stream while mine is waiting
// (my own previous save coming back, or a colleague's) is older than what my screen shows. Shown,
// it would put Decimals or Freeze back, and my next gesture (a column width) would start from those
// old settings and save them. It is held back instead; once my save is answered it is shown only if
// the server took it after mine.
import type { DisplaySettings } from './displaySettings.js';

interface Waiting {
  saves: number;
  /** The latest revision my finished saves made (0 while none has). */
  saved: number;
  /** The latest settings revision that arrived meanwhile. */
  held: { revision: number; display: DisplaySettings } | null;
}

export class DisplaySaves {
  private readonly waiting = new Map<string, Waiting>();

  /** A save of this sheet's display settings is scheduled or under way. */
  begin(sheetId: string) {
    const w = this.waiting.get(sheetId) ?? { saves: 0, saved: 0, held: null };
    w.saves++;
    this.waiting.set(sheetId, w);
  }

  /**
   * That save was answered with `revision`, or failed (null). Once none is waiting, returns the
   * settings to show: the ones that arrived meanwhile if the server took them after my last answered
   * save (or after none), else null.
   */
  end(sheetId: string, revision: number | null): DisplaySettings | null {
    const w = this.waiting.get(sheetId);
    if (!w) return null;
    if (revision !== null) w.saved = Math.max(w.saved, revision);
    if (--w.saves > 0) return null;
    this.waiting.delete(sheetId);
    return w.held && w.held.revision > w.saved ? w.held.display : null;
  }

  /** A settings revision from the stream: true when it is held back (a save of mine is waiting). */
  holdBack(sheetId: string, revision: number, display: DisplaySettings): boolean {
    const w = this.waiting.get(sheetId);
    if (!w) return false;
    if (!w.held || revision > w.held.revision) w.held = { revision, display };
    return true;
  }
}
