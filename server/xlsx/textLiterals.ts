// Text from a file must stay text in Orbitab. A cell stored as the text "007", "TRUE", "#N/A" or
// "=cmd" would otherwise be read by the engine as a number, a boolean, an error or a formula; a
// leading apostrophe keeps it text (the engine shows the value without it — common practice in
// spreadsheets). The engine itself decides what needs one, so the rule cannot drift from its parser.
import { createEngine } from '../../functions/engine.js';

// Only text that could parse as something else is probed: numbers, dates and times start with a
// digit, a sign, a decimal point, a currency sign or a bracket (or end with %, a currency sign or a
// space); errors start with '#'; booleans are two words. Text starting with a letter is text.
// tests/xlsx-text-literals.test.ts checks this filter against the engine itself.
const MAYBE_NOT_TEXT = /^[\s\d=+\-'#.,$€£¥(]|[\s%$€£¥]$|^(?:true|false)$/i;

/** For each text, whether it needs a leading apostrophe to stay text. `probeAll` skips the filter (tests). */
export function textsNeedingApostrophe(texts: string[], opts: { probeAll?: boolean } = {}): boolean[] {
  const result = texts.map(() => false);
  const probeIndex: number[] = [];
  texts.forEach((t, i) => {
    if (t.startsWith('=') || t.startsWith("'")) result[i] = true;
    else if (opts.probeAll || MAYBE_NOT_TEXT.test(t)) probeIndex.push(i);
  });
  if (probeIndex.length === 0) return result;
  const engine = createEngine({ probe: probeIndex.map((i) => [texts[i]]) });
  try {
    const sheet = engine.getSheetId('probe')!;
    probeIndex.forEach((textIndex, row) => {
      const value = engine.getCellValue({ sheet, row, col: 0 });
      result[textIndex] = value !== texts[textIndex];
    });
  } finally {
    engine.destroy();
  }
  return result;
}

export function asTextInput(text: string, needsApostrophe: boolean): string {
  return needsApostrophe ? `'${text}` : text;
}
