// A bounded memo keyed by the text a user typed, shared by the species parser and the diatomic
// analysis: a screening column repeats a few texts many thousands of times, so a repeat costs one
// Map lookup. Rejections (ChemError) are remembered too, since a column of the same typo is as
// common as a column of the same species; any other error is a bug and is never cached. The map is
// emptied when it reaches its limit, so a sheet of ever-different junk cannot grow it without bound.
import { ChemError } from './errors.js';

export class TextMemo<T> {
  private readonly entries = new Map<string, T | ChemError>();
  /** How many values were actually computed (misses) since the last clear: for tests and benchmarks. */
  misses = 0;

  constructor(private readonly limit: number) {}

  /** The value for `text`, computing it with `compute` on a miss; a remembered ChemError is thrown again. */
  get(text: string, compute: () => T): T {
    let entry = this.entries.get(text);
    if (entry === undefined) {
      this.misses++;
      try {
        entry = compute();
      } catch (e) {
        if (!(e instanceof ChemError)) throw e;
        entry = e;
      }
      if (this.entries.size >= this.limit) this.entries.clear();
      this.entries.set(text, entry);
    }
    if (entry instanceof ChemError) throw entry;
    return entry;
  }

  clear(): void {
    this.entries.clear();
    this.misses = 0;
  }
}
