// The stored-result key of a structure: SHA-256 of ehtKeyText (method version, charge, normalised text).
import { createHash } from 'node:crypto';

export function structureHash(keyText: string): string {
  return createHash('sha256').update(keyText).digest('hex');
}
