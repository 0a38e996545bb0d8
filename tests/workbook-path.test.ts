// One builder for workbook addresses (shared/workbooks.ts workbookPath): what it writes, and that the
// client and shared code build no workbook address by hand.
import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { exportPath } from '../shared/io.js';
import { workbookPath } from '../shared/workbooks.js';

describe('workbookPath', () => {
  it('writes the workbook and the segments under it, each URI-encoded', () => {
    expect(workbookPath('wb_1')).toBe('/workbooks/wb_1');
    expect(workbookPath('wb_1', 'sheets', 's-2')).toBe('/workbooks/wb_1/sheets/s-2');
    expect(workbookPath('wb_1', 'revisions', 7, 'restore')).toBe('/workbooks/wb_1/revisions/7/restore');
    expect(workbookPath('a/b?c', 'members', 'd e')).toBe('/workbooks/a%2Fb%3Fc/members/d%20e');
  });

  it('is what the export link is built on', () => {
    expect(exportPath('wb 1', 'csv', 's1')).toBe('/api/workbooks/wb%201/export?format=csv&sheet=s1');
  });

  it('is the only place the client and shared code write a /workbooks/<id> address', () => {
    const root = path.resolve(import.meta.dirname, '..');
    const handBuilt: string[] = [];
    const walk = (dir: string) => {
      for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
        const full = path.join(dir, entry.name);
        if (entry.isDirectory()) walk(full);
        else if (/\.tsx?$/.test(entry.name) && /\/workbooks\/\$\{/.test(fs.readFileSync(full, 'utf8'))) handBuilt.push(path.relative(root, full));
      }
    };
    walk(path.join(root, 'src'));
    walk(path.join(root, 'shared'));
    expect(handBuilt).toEqual([]);
  });
});
