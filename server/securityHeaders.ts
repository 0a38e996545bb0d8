// Response headers that keep the app from being framed, sniffed or fed foreign scripts, set by
// helmet. The one inline script (index.html's theme-before-paint) is allowed by its SHA-256 hash,
// computed from the index.html actually served, so editing the script cannot silently break it.
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import type { RequestHandler } from 'express';
import helmet from 'helmet';
import type { AppConfig } from './config.js';

/** `'sha256-…'` sources for every inline <script> (without src) in an HTML page. */
export function inlineScriptHashes(html: string): string[] {
  const hashes: string[] = [];
  for (const m of html.matchAll(/<script(?![^>]*\bsrc=)[^>]*>([\s\S]*?)<\/script>/gi)) {
    hashes.push(`'sha256-${createHash('sha256').update(m[1], 'utf8').digest('base64')}'`);
  }
  return hashes;
}

function servedIndexHtml(config: Pick<AppConfig, 'production' | 'clientDir'>): string {
  const built = path.join(config.clientDir, 'index.html');
  const file = config.production && fs.existsSync(built) ? built : path.resolve(import.meta.dirname, '../index.html');
  return fs.existsSync(file) ? fs.readFileSync(file, 'utf8') : '';
}

export function securityHeaders(config: Pick<AppConfig, 'production' | 'clientDir' | 'viteDevServer'>): RequestHandler {
  const scriptHashes = inlineScriptHashes(servedIndexHtml(config));
  const headers = helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        'default-src': ["'self'"],
        'script-src': ["'self'", ...scriptHashes],
        'script-src-attr': ["'none'"],
        // React and the charts set style attributes; styles cannot run code.
        'style-src': ["'self'", "'unsafe-inline'"],
        'img-src': ["'self'", 'data:', 'blob:'],
        'font-src': ["'self'", 'data:'],
        'connect-src': ["'self'"],
        'worker-src': ["'self'", 'blob:'],
        'object-src': ["'none'"],
        'base-uri': ["'self'"],
        'form-action': ["'self'"],
        'frame-ancestors': ["'none'"],
      },
    },
    // HSTS is set below, and only on https responses (on plain http it means nothing and would
    // stick to a localhost name).
    strictTransportSecurity: false,
    referrerPolicy: { policy: 'no-referrer' },
    xFrameOptions: { action: 'deny' },
  });
  // Under `npm run dev` Vite serves the page with its own inline module preamble for hot reload,
  // which this policy would block; the other headers stay.
  const devHeaders = helmet({ contentSecurityPolicy: false, strictTransportSecurity: false, referrerPolicy: { policy: 'no-referrer' }, xFrameOptions: { action: 'deny' } });
  const chosen = config.viteDevServer ? devHeaders : headers;
  return (req, res, next) => {
    if (req.secure) res.setHeader('Strict-Transport-Security', 'max-age=31536000; includeSubDomains');
    chosen(req, res, next);
  };
}
