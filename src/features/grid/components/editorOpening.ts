// How the cell editor was opened decides where the caret goes: typing a character replaces the
// cell's text (the character is the new start), while F2, Enter or a double-click open it to
// change what is there, with the caret at the end (desktop-spreadsheet convention, common practice).
let typedAt = -Infinity;

/** Called for a printable key pressed on a cell that is not being edited. */
export function noteTypingIntoCell(): void {
  typedAt = performance.now();
}

/** True when the editor opening now was opened by that key (within the same moment). */
export function openedByTyping(): boolean {
  const recent = performance.now() - typedAt < 250;
  typedAt = -Infinity;
  return recent;
}
