// Counts in messages are written with thousands separators, as every other number the app shows.
import { describe, expect, it } from 'vitest';
import { plural } from '../shared/plural.js';

describe('plural', () => {
  it('writes one without an s, others with it, and large counts grouped by thousands', () => {
    expect(plural(1, 'cell')).toBe('1 cell');
    expect(plural(0, 'cell')).toBe('0 cells');
    expect(plural(41_000, 'cell')).toBe('41,000 cells');
    expect(plural(2, 'sheet', 'sheets of the file')).toBe('2 sheets of the file');
  });
});
