// What an XYZ frame's comment line may state beyond a name. XYZ carries only elements and
// coordinates, so a net charge can only travel in the free-text comment; one reader serves the
// structure import (bond perception and the charge it writes into the formulas) and the cell
// functions reading typed or pasted XYZ text, so both read the same comment the same way.

/** A net charge written in a frame's comment line: "charge=-1", "charge: +2", "charge 1" (case ignored); a fraction or no such word gives none. */
export function chargeFromComment(comment: string): number | undefined {
  const m = /\bcharge\s*[=:]?\s*([+-]?\d+)(?![\d.])/i.exec(comment);
  return m ? Number(m[1]) : undefined;
}
