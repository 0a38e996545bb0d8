// Sends a spreadsheet to POST /api/imports with XMLHttpRequest, the one browser API that reports
// upload progress (fetch does not). Errors arrive as the app's ApiError, like every other call.
import type { ImportResponse } from '@shared/io.js';
import { ApiError } from '../../lib/api.js';
import { dropEarlyGets } from '../../lib/earlyGets.js';

export interface UploadProgress {
  /** Bytes sent so far and in all; the server starts reading once loaded === total. */
  loaded: number;
  total: number;
}

export function uploadSpreadsheet(
  file: File,
  opts: { workbookId?: string; onProgress?: (p: UploadProgress) => void; signal?: AbortSignal } = {},
): Promise<ImportResponse> {
  dropEarlyGets(); // the import changes what the page's early answers showed
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', '/api/imports');
    xhr.withCredentials = true;
    xhr.responseType = 'text';
    xhr.upload.onprogress = (e) => opts.onProgress?.({ loaded: e.loaded, total: e.lengthComputable ? e.total : file.size });
    xhr.onerror = () => reject(new ApiError(0, 'network', 'the upload did not reach the server; check the connection and try again'));
    xhr.onabort = () => reject(new ApiError(0, 'aborted', 'upload cancelled'));
    xhr.onload = () => {
      let body: unknown = null;
      try {
        body = xhr.responseText ? JSON.parse(xhr.responseText) : null;
      } catch {
        body = null;
      }
      if (xhr.status >= 200 && xhr.status < 300 && body) return resolve(body as ImportResponse);
      const err = (body as { error?: { code?: string; message?: string; details?: unknown } } | null)?.error;
      reject(new ApiError(xhr.status, err?.code ?? 'http_error', err?.message ?? `the server answered ${xhr.status} ${xhr.statusText}`, err?.details));
    };
    opts.signal?.addEventListener('abort', () => xhr.abort(), { once: true });
    const form = new FormData();
    if (opts.workbookId) form.append('workbookId', opts.workbookId);
    form.append('file', file, file.name);
    xhr.send(form);
  });
}
