// Sorting and filtering rules, and number display (desktop-spreadsheet conventions, common practice).
import { describe, expect, it } from 'vitest';
import { distinctValues, filterRows, matchesFilter, sortPermutation, type SortValue } from '../src/core/workbook/model/sortFilter.js';
import { formatNumber } from '../src/core/workbook/model/cellView.js';

describe('sorting a block by one column', () => {
  it('orders numbers by value, ascending and descending', () => {
    expect(sortPermutation([3, 1, 2.5], 'ascending')).toEqual([1, 2, 0]);
    expect(sortPermutation([3, 1, 2.5], 'descending')).toEqual([0, 2, 1]);
  });

  it('puts numbers before text, text before booleans, booleans before errors when ascending', () => {
    const keys: SortValue[] = [{ error: '#VALUE!' }, true, 'N2', 2, false, 'CO', -1];
    const order = sortPermutation(keys, 'ascending').map((i) => keys[i]);
    expect(order).toEqual([-1, 2, 'CO', 'N2', false, true, { error: '#VALUE!' }]);
  });

  it('compares text without regard to case and with natural digit order', () => {
    const keys: SortValue[] = ['o2', 'N2', 'C10', 'C9'];
    expect(sortPermutation(keys, 'ascending').map((i) => keys[i])).toEqual(['C9', 'C10', 'N2', 'o2']);
  });

  it('keeps empty cells at the bottom in both directions', () => {
    const keys: SortValue[] = [null, 2, '', 1];
    expect(sortPermutation(keys, 'ascending')).toEqual([3, 1, 0, 2]);
    expect(sortPermutation(keys, 'descending')).toEqual([1, 3, 0, 2]);
  });

  it('keeps rows with equal keys in their original order (stable)', () => {
    expect(sortPermutation([1, 0, 1, 0, 1], 'ascending')).toEqual([1, 3, 0, 2, 4]);
    expect(sortPermutation([1, 0, 1, 0, 1], 'descending')).toEqual([0, 2, 4, 1, 3]);
  });
});

describe('filtering rows by a column value', () => {
  const column = ['O2', 'n2', ' O2 ', 'NO+', '', 'O2-'];

  it('keeps rows whose value equals the chosen one, ignoring case and outer spaces', () => {
    expect(filterRows(0, column.length - 1, (r) => column[r], { kind: 'equals', text: 'o2' })).toEqual([0, 2]);
  });

  it('keeps rows whose value contains the text', () => {
    expect(filterRows(0, column.length - 1, (r) => column[r], { kind: 'contains', text: 'O2' })).toEqual([0, 2, 5]);
  });

  it('filters only the rows it is asked about', () => {
    expect(filterRows(1, 3, (r) => column[r], { kind: 'contains', text: 'o' })).toEqual([2, 3]);
  });

  it('matches an empty criterion of kind equals only against empty cells', () => {
    expect(matchesFilter('', { kind: 'equals', text: '' })).toBe(true);
    expect(matchesFilter('O2', { kind: 'equals', text: '' })).toBe(false);
  });

  it('lists distinct values most frequent first, counting case variants together', () => {
    expect(distinctValues(['O2', 'N2', 'o2', 'CO', 'O2'])).toEqual([
      { text: 'O2', count: 3 },
      { text: 'CO', count: 1 },
      { text: 'N2', count: 1 },
    ]);
  });
});

describe('number display', () => {
  it('shows whole numbers as they are and others to six significant digits in the automatic format', () => {
    expect(formatNumber(-1e-16, 3)).toBe('0.000');
    expect(formatNumber(-0, 2)).toBe('0.00');
    expect(formatNumber(-0.0004, 3)).toBe('0.000');
    expect(formatNumber(-0.0006, 3)).toBe('-0.001');
    expect(formatNumber(2, null)).toBe('2');
    expect(formatNumber(2.5, null)).toBe('2.5');
    expect(formatNumber(1 / 3, null)).toBe('0.333333');
    expect(formatNumber(Math.sqrt(8), null)).toBe('2.82843');
    expect(formatNumber(123456.789, null)).toBe('123457');
    expect(formatNumber(1234567.5, null)).toBe('1.23457E+6');
  });

  it('switches to scientific notation for very large and very small magnitudes', () => {
    expect(formatNumber(6.02214076e23, null)).toBe('6.02214E+23');
    expect(formatNumber(1.602176634e-19, null)).toBe('1.60218E-19');
    expect(formatNumber(-0.00001, null)).toBe('-1E-5');
  });

  it('rounds to a fixed number of decimal places when the sheet asks for it', () => {
    expect(formatNumber(2.828427, 2)).toBe('2.83');
    expect(formatNumber(2, 3)).toBe('2.000');
    expect(formatNumber(0.5, 0)).toBe('1');
  });
});

describe('predicted against measured in the chart panel', () => {
  it('reports the mean and RMS of Y − X and the farthest point (worked by hand)', async () => {
    const { agreement } = await import('../src/features/chart/chartData.js');
    // Differences 10, −20, 30: mean 20/3, RMS √((100 + 400 + 900)/3) = √(1400/3).
    const fit = agreement([{ x: 400, y: 410 }, { x: 500, y: 480 }, { x: 600, y: 630 }])!;
    expect(fit.mean).toBeCloseTo(20 / 3, 12);
    expect(fit.rms).toBeCloseTo(Math.sqrt(1400 / 3), 12);
    expect(fit.worst).toEqual({ x: 600, y: 630 });
    expect(agreement([])).toBeNull();
  });
});
