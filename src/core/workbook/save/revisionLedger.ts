// Which revisions this browser has taken in, and so which baseRevision a patch may claim. The server
// refuses (409) a change to a cell that another revision wrote after the patch's base; a base that
// runs ahead of what this browser has shown would let my next edit overwrite a colleague's input
// that I never saw, with no conflict. So the one rule is:
//
//   the base moves past a revision only once every change in it is here — my own acknowledged
//   patch, or a colleague's revision applied from the live feed — and never past a revision whose
//   change to a cell is held back behind an input of mine still waiting to be saved.
//
// An acknowledgement that skips revisions I have not seen yet leaves the base where it was; those
// revisions arrive over the live feed (or are fetched) and the base then catches up.
import { cellKey, cellKeyPrefix } from '../../../../shared/a1.js';
import type { CellInput } from './pendingStore.js';

export interface CellRef {
  sheetId: string;
  row: number;
  col: number;
}

export { cellKey };

interface Block {
  /** The last revision the block covers (a snapshot restored from an earlier visit covers several). */
  through: number;
  /** A settled cell leaves the block when what settled it is at least this revision. */
  clearsFrom: number;
  /** Cells whose change in this block is not shown here, with that change (null: not known). */
  held: Map<string, CellInput | null>;
}

export class RevisionLedger {
  private included: number;
  /** Revisions above the base, keyed by their first revision. */
  private blocks = new Map<number, Block>();
  /** Per cell, the latest revision whose input for that cell this browser knows (saved or chosen). */
  private known = new Map<string, number>();

  constructor(base: number) {
    this.included = base;
  }

  /** Every revision up to this one is taken in: the base the next patch may claim. */
  get base(): number {
    return this.included;
  }

  /**
   * The lowest base a patch carrying this cell may claim: after I saved it (or chose my input over a
   * colleague's) as of revision n, a patch on an older base would meet my own revision as a conflict.
   */
  floor(cell: CellRef): number {
    return this.known.get(cellKey(cell)) ?? 0;
  }

  /** A colleague's revision (or my own, echoed) applied here, except the `heldBack` inputs. */
  takeIn(revision: number, heldBack: readonly CellInput[]): void {
    if (this.covers(revision)) return;
    const held = new Map<string, CellInput | null>();
    // A held-back change I already know to be superseded (I saved or chose over it later) is no gap.
    for (const c of heldBack) if ((this.known.get(cellKey(c)) ?? -1) < revision) held.set(cellKey(c), c);
    this.blocks.set(revision, { through: revision, clearsFrom: revision, held });
    this.advance();
  }

  /** The server stored my patch as this revision: nothing in it is anyone else's. */
  own(revision: number): void {
    if (revision <= this.included) return;
    const block = this.blocks.get(revision);
    if (block) block.held.clear();
    else this.blocks.set(revision, { through: revision, clearsFrom: revision, held: new Map() });
    this.advance();
  }

  /**
   * The server's input for these cells is now known as of `revision` (my patch saved them, or a 409
   * told me theirs and I chose). Held-back changes up to then are settled. A later held-back change of
   * a colleague's is settled too where no input of mine waits any more: it is returned (the newest per
   * cell) to be shown, since it is newer than anything here.
   */
  settle(cells: readonly { cell: CellRef; revision: number; mineStillWaiting: boolean }[]): CellInput[] {
    const shown: CellInput[] = [];
    for (const { cell, revision, mineStillWaiting } of cells) {
      const key = cellKey(cell);
      this.known.set(key, Math.max(this.known.get(key) ?? -1, revision));
      let newest: { revision: number; input: CellInput } | null = null;
      for (const [first, block] of this.blocks) {
        if (!block.held.has(key)) continue;
        if (block.clearsFrom > revision) {
          if (mineStillWaiting) continue;
          const input = block.held.get(key);
          if (input && (!newest || first > newest.revision)) newest = { revision: first, input };
        }
        block.held.delete(key);
      }
      if (newest) shown.push(newest.input);
    }
    this.advance();
    return shown;
  }

  /**
   * Unsent changes from an earlier visit were put back on top of the freshly loaded workbook: the
   * revisions between their base and the load are in, except for those cells, until each is settled.
   */
  restore(snapshotBase: number, cells: readonly CellRef[]): void {
    if (snapshotBase >= this.included) return;
    const held = new Map<string, CellInput | null>(cells.map((c) => [cellKey(c), null]));
    // Whatever settles a restored cell comes from the server after the load, so it always clears it.
    this.blocks.set(snapshotBase + 1, { through: this.included, clearsFrom: 0, held });
    this.included = snapshotBase;
    this.advance();
  }

  /** A deleted sheet's cells have nothing left to overwrite. */
  dropSheet(sheetId: string): void {
    const prefix = cellKeyPrefix(sheetId);
    for (const key of this.known.keys()) if (key.startsWith(prefix)) this.known.delete(key);
    for (const block of this.blocks.values()) for (const key of block.held.keys()) if (key.startsWith(prefix)) block.held.delete(key);
    this.advance();
  }

  private covers(revision: number): boolean {
    if (revision <= this.included) return true;
    for (const [first, block] of this.blocks) if (revision >= first && revision <= block.through) return true;
    return false;
  }

  private advance() {
    const before = this.included;
    for (let block = this.blocks.get(this.included + 1); block && block.held.size === 0; block = this.blocks.get(this.included + 1)) {
      this.blocks.delete(this.included + 1);
      this.included = block.through;
    }
    // What is at or below the base no longer holds any cell back.
    if (this.included !== before) for (const [key, revision] of this.known) if (revision <= this.included) this.known.delete(key);
  }
}
