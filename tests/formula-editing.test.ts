// The pure rules behind typing formulas: brackets closed on commit, where a pointed-at cell may be
// inserted, which argument the caret is in, and parse errors in plain words naming the position
// (each engine message here comes from HyperFormula itself, through createEngine).
import { describe, expect, it } from 'vitest';
import { DetailedCellError } from 'hyperformula';
import { acceptsReference, argumentAt, closeBrackets, formulaShape } from '../functions/formulaShape.js';
import { explainCellError } from '../functions/cellErrors.js';
import { createEngine } from '../functions/engine.js';

describe('closing brackets on commit', () => {
  it('closes what was left open', () => {
    expect(closeBrackets('=MOCONFIG(A2')).toBe('=MOCONFIG(A2)');
    expect(closeBrackets('=ROUND(BONDORDER(A2')).toBe('=ROUND(BONDORDER(A2))');
  });
  it('leaves balanced formulas, plain text and brackets inside strings alone', () => {
    expect(closeBrackets('=BONDORDER(A2)')).toBe('=BONDORDER(A2)');
    expect(closeBrackets('(not a formula')).toBe('(not a formula');
    expect(closeBrackets('=LEN("(((")')).toBe('=LEN("(((")');
    expect(closeBrackets('=CONCAT("a(", B1')).toBe('=CONCAT("a(", B1)');
  });
  it('does not guess when a string is still open or a ) is stray', () => {
    expect(closeBrackets('=LEN("abc')).toBe('=LEN("abc');
    expect(closeBrackets('=1+2)')).toBe('=1+2)');
  });
  it('reads quoted sheet names and doubled quotes as text', () => {
    expect(formulaShape("='it''s (x'!A1+(1").openBrackets).toEqual([15]);
    expect(formulaShape('="say ""hi("" "&(A1').openBrackets).toEqual([16]);
  });
});

describe('pointing at cells while typing', () => {
  it('accepts a reference after =, an operator, a bracket or a comma', () => {
    for (const t of ['=', '=A1+', '=BONDORDER(', '=SUM(A1, ', '=A1:']) expect(acceptsReference(t, t.length), t).toBe(true);
  });
  it('not after a value, inside a string or in plain text', () => {
    for (const t of ['=A1', '=BONDORDER(A2)', '=LEN("a+', 'O2+', '=2']) expect(acceptsReference(t, t.length), t).toBe(false);
  });
});

describe('which argument the caret is in', () => {
  it('counts commas of the innermost call only', () => {
    expect(argumentAt('=PIGAP(B6,', 10)).toEqual({ name: 'PIGAP', index: 1 });
    expect(argumentAt('=ROUND(BONDORDER(A2', 19)).toEqual({ name: 'BONDORDER', index: 0 });
    expect(argumentAt('=ROUND(BONDORDER(A2),', 21)).toEqual({ name: 'ROUND', index: 1 });
  });
  it('ignores commas inside strings and array literals', () => {
    expect(argumentAt('=MOCONFIG("a,b", ', 17)).toEqual({ name: 'MOCONFIG', index: 1 });
    expect(argumentAt('=SUM({1,2;3,4}, ', 16)).toEqual({ name: 'SUM', index: 1 });
  });
  it('gives nothing outside a call or after it is closed', () => {
    expect(argumentAt('=A1+', 4)).toBeNull();
    expect(argumentAt('=BONDORDER(A1)+', 15)).toBeNull();
  });
});

describe('parse errors in plain words, naming the position', () => {
  const errorOf = (formula: string) => {
    const v = createEngine({ S: [[formula]] }).getCellValue({ sheet: 0, row: 0, col: 0 });
    if (!(v instanceof DetailedCellError)) throw new Error(`${formula} parsed`);
    expect(v.message).toMatch(/^Parsing error/); // the engine's own words, which nobody should see
    return explainCellError(v, formula);
  };
  it('an unclosed bracket names where it opened', () => {
    expect(errorOf('=MOCONFIG(')).toBe("the bracket opened at character 10 is never closed: add ')'");
  });
  it('a formula ending on an operator says what is missing', () => {
    expect(errorOf('=A1+')).toBe("the formula ends after '+' (character 4): a value or cell is missing");
  });
  it('two operators in a row name the second', () => {
    expect(errorOf('=1+*2')).toBe("'*' at character 4 is not expected there: a value or cell is missing before it");
  });
  it('a stray closing bracket, an open string and a stray character are named', () => {
    expect(errorOf('=SUM(1,2))')).toBe("the ')' at character 10 closes a bracket that was never opened");
    expect(errorOf('="abc')).toBe('the text starting at character 2 has no closing quote');
    expect(errorOf('=@')).toBe("'@' at character 2 does not belong in a formula");
  });
  it('a semicolon between arguments is pointed out', () => {
    expect(errorOf('=SUM(1;2)')).toBe("the ';' at character 7 should be a ',' between arguments");
  });
  it('two values with nothing between them', () => {
    expect(errorOf('=1 2')).toBe("'2' at character 4 follows a complete formula: an operator or ',' is missing before it");
  });
  it('never shows the parser’s token names', () => {
    for (const f of ['=MOCONFIG(', '=1+*2', '=A1:', '=2+)', '=1 2']) expect(errorOf(f)).not.toMatch(/token|RParen|EOF|-->/i);
  });
});
