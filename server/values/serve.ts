// Answers GET …/values from a revision's stored values: the stored gzip bytes go out as they are to
// any client that accepts gzip (every browser and HTTP library), so serving them costs no parsing.
import { gunzipSync } from 'node:zlib';
import type { Request, Response } from 'express';
import type { StoredValues } from './store.js';

/** Says where the answer's values came from: 'stored' (kept with the revision) or 'computed' (just now). */
export const valuesSourceHeader = 'Orbitab-Values';

export function sendStoredValues(req: Request, res: Response, stored: StoredValues) {
  res.setHeader(valuesSourceHeader, 'stored');
  res.vary('Accept-Encoding');
  res.type('application/json');
  if (req.acceptsEncodings('gzip')) {
    res.setHeader('Content-Encoding', 'gzip');
    res.send(stored.valuesGzip);
  } else res.send(gunzipSync(stored.valuesGzip));
}
