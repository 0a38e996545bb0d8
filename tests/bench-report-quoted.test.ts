// The committed benchmark report and the figures README quotes come from one `npm run bench` run:
// bench/report.md must be exactly what bench/report.ts renders from bench/report.json, and every
// figure README's Performance section quotes must be one of that report's results.
import fs from 'node:fs';
import { describe, expect, it } from 'vitest';
import { renderReport, summaryRows, type BenchReport } from '../bench/report.js';

const json = JSON.parse(fs.readFileSync('bench/report.json', 'utf8')) as BenchReport & { summary: unknown };
const markdown = fs.readFileSync('bench/report.md', 'utf8');
const readme = fs.readFileSync('README.md', 'utf8');

describe('the benchmark figures in the repository', () => {
  it('keeps bench/report.md as rendered from bench/report.json', () => {
    expect(markdown).toBe(renderReport(json));
  });

  it('keeps the JSON summary equal to the rows its outcomes give', () => {
    expect(json.summary).toEqual(summaryRows(json));
  });

  it('quotes in README only ratios, rates and targets that the report shows', () => {
    const section = readme.slice(readme.indexOf('## Performance'), readme.indexOf('\n## ', readme.indexOf('## Performance') + 1));
    expect(section.length).toBeGreaterThan(100);
    const values = summaryRows(json).map((r) => `${r.value} ${r.target}`).join(' | ');
    // Ratios such as "1.78×" and rates such as "523 patches/s": README may round to fewer digits.
    const quoted = [...section.matchAll(/(\d+(?:\.\d+)?)×|(\d[\d,]*) patches\/s|p95 (\d+) ms/g)];
    expect(quoted.length).toBeGreaterThan(5);
    const reported = [...values.matchAll(/\d[\d,]*(?:\.\d+)?/g)].map((m) => Number(m[0].replace(/,/g, '')));
    for (const m of quoted) {
      const text = m[1] ?? m[2] ?? m[3];
      const n = Number(text.replace(/,/g, ''));
      const decimals = text.split('.')[1]?.length ?? 0;
      const tolerance = 0.5 * 10 ** -decimals + 1e-9;
      expect(reported.some((r) => Math.abs(r - n) <= tolerance), `README quotes ${m[0]}, which the report does not show`).toBe(true);
    }
  });
});
