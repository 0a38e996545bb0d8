// A1-style addresses for messages people read ("Sheet1!B3"), from 0-based row and column.

export function columnLetters(col: number): string {
  let letters = '';
  for (let n = col + 1; n > 0; n = Math.floor((n - 1) / 26)) letters = String.fromCharCode(65 + ((n - 1) % 26)) + letters;
  return letters;
}

export function cellAddress(sheetName: string, row: number, col: number): string {
  // A sheet name with anything but letters, digits and underscores is quoted, as in formulas.
  const sheet = /^[A-Za-z_][A-Za-z0-9_]*$/.test(sheetName) ? sheetName : `'${sheetName.replace(/'/g, "''")}'`;
  return `${sheet}!${columnLetters(col)}${row + 1}`;
}
