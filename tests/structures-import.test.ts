// Structure files in and out: SDF/MOL/XYZ uploads become a sheet with one row per record (name,
// SMILES, formula, the record itself, extended-Hückel columns reading it); damaged records are
// reported by number while the rest are taken; nothing is stored when the file is refused; xlsx and
// CSV exports keep the record text exactly.
import ExcelJS from 'exceljs';
import { afterAll, describe, expect, it } from 'vitest';
import { readStructures } from '../server/structures/readStructures.js';
import { closeParsePool } from '../server/xlsx/parseInWorker.js';
import { makeTestApp } from './helpers/app.js';

afterAll(() => closeParsePool());

/** A V2000 molfile from atoms (element, x, y, z in Å) and bonds (1-based atom pairs). */
function molfile(name: string, atoms: [string, number, number, number][], bonds: [number, number][], dim = '3D'): string {
  const f = (x: number) => x.toFixed(4).padStart(10);
  return [
    name,
    `  Orbitab ${dim}`.padEnd(20) + dim,
    '',
    `${String(atoms.length).padStart(3)}${String(bonds.length).padStart(3)}  0  0  0  0  0  0  0  0999 V2000`,
    ...atoms.map(([el, x, y, z]) => `${f(x)}${f(y)}${f(z)} ${el.padEnd(3)} 0  0  0  0  0  0  0  0  0  0  0  0`),
    ...bonds.map(([a, b]) => `${String(a).padStart(3)}${String(b).padStart(3)}  1  0  0  0  0`),
    'M  END',
  ].join('\n');
}

// Water at its measured gas-phase geometry, r(OH) 0.9578 Å, ∠HOH 104.48° (NIST CCCBDB; recalled from memory).
const water = molfile('water', [['O', 0, 0, 0], ['H', 0.7574, 0, 0.5864], ['H', -0.7574, 0, 0.5864]], [[1, 2], [1, 3]]);
// Methane: tetrahedral, r(CH) 1.087 Å (NIST CCCBDB; recalled from memory).
const d = 1.087 / Math.sqrt(3);
const methane = molfile('methane', [['C', 0, 0, 0], ['H', d, d, d], ['H', -d, -d, d], ['H', -d, d, -d], ['H', d, -d, -d]], [[1, 2], [1, 3], [1, 4], [1, 5]]);
const flatEthanol = molfile('ethanol (2D)', [['C', 0, 0, 0], ['C', 1.5, 0, 0], ['O', 2.2, 1.2, 0]], [[1, 2], [2, 3]], '2D');
const broken = 'broken\n  junk\n\n  2  1  0  0  0  0  0  0  0  0999 V2000\n    0.0000    0.0000    0.0000 O   0\n';
const sdf = [water, '> <Supplier>\nin-house\n', '$$$$', broken, '$$$$', methane, '$$$$', flatEthanol, '$$$$', ''].join('\n');

const xyz = ['3', 'water', 'O 0 0 0', 'H 0.7574 0 0.5864', 'H -0.7574 0 0.5864', '2', 'damaged frame', 'H 0 0 0', 'Q x y z', '2', 'hydrogen', 'H 0 0 0', 'H 0 0 0.7414', ''].join('\n');

const bytes = (s: string) => new TextEncoder().encode(s);

describe('reading structure files', () => {
  it('makes one row per SDF record with name, SMILES, Hill formula, the molfile and EHT formulas on it', () => {
    const parsed = readStructures(bytes(sdf), 'ligands.sdf', 'sdf');
    const cells = parsed.sheets[0].cells;
    const at = (r: number, c: number) => cells.find(([row, col]) => row === r && col === c)?.[2];
    expect([0, 1, 2, 3].map((c) => at(0, c))).toEqual(['Name', 'SMILES', 'Formula', 'Record']);
    expect(at(1, 0)).toBe('water');
    expect(at(1, 1)).toBe('O');
    expect(at(1, 2)).toBe('H2O');
    expect(at(1, 3)).toBe(water);
    expect(at(1, 4)).toBe('=EHTHOMO(D2)');
    expect(at(2, 0)).toBe('methane');
    expect(at(2, 2)).toBe('CH4');
    // A 2D record keeps its molfile, but its EHT columns read the SMILES (a generated conformer).
    expect(at(3, 2)).toBe('C2H6O');
    expect(at(3, 4)).toBe('=EHTHOMO(B4)');
    expect(parsed.summary.notes.join(' ')).toMatch(/1 record has 2D coordinates/);
    expect(parsed.summary.skipped).toEqual([expect.objectContaining({ address: 'record 2', reason: expect.stringMatching(/^record 2: no "M {2}END" line/) })]);
  });

  it('reads every frame of a multi-frame XYZ file and names the damaged one', () => {
    const parsed = readStructures(bytes(xyz), 'frames.xyz', 'xyz');
    const cells = parsed.sheets[0].cells;
    const at = (r: number, c: number) => cells.find(([row, col]) => row === r && col === c)?.[2];
    expect(at(1, 0)).toBe('water');
    expect(at(1, 2)).toBe('H2O');
    expect(at(1, 3)).toBe('3\nwater\nO 0 0 0\nH 0.7574 0 0.5864\nH -0.7574 0 0.5864');
    expect(at(2, 0)).toBe('hydrogen');
    expect(at(2, 2)).toBe('H2');
    expect(parsed.summary.skipped).toEqual([expect.objectContaining({ reason: expect.stringMatching(/^record 2: atom line 2 "Q x y z" is not "element x y z"/) })]);
  });

  it('refuses a file of too many records as a whole, and reports a record longer than a cell holds', () => {
    const many = Array.from({ length: 5_001 }, () => methane).join('\n$$$$\n');
    expect(() => readStructures(bytes(many), 'many.sdf', 'sdf')).toThrow(/5,001 records; at most 5,000/);
    const hugeComment = ['1', 'x'.repeat(40_000), 'H 0 0 0', '1', 'ok', 'H 0 0 0'].join('\n');
    const parsed = readStructures(bytes(hugeComment), 'long.xyz', 'xyz');
    // The frame's name (its comment) is cut to 200 characters, so the record fits; a record itself too long is refused.
    expect(parsed.summary.skipped).toEqual([]);
    const longRecord = ['20000', 'long', ...Array.from({ length: 20_000 }, () => 'H 0 0 0')].join('\n');
    const refused = readStructures(bytes(longRecord), 'long.xyz', 'xyz');
    expect(refused.summary.skipped[0].reason).toBe(`record "long": ${longRecord.length.toLocaleString('en')} characters, more than the 32,767 a cell holds`);
  });
});

describe('structure upload, values and export round trip', { timeout: 300_000 }, async () => {
  const t = makeTestApp();
  const owner = await t.signUp('owner@example.com', 'Olive Owner');
  const created = await owner.agent.post('/api/workbooks').send({ title: 'Ligand screen' });
  const workbookId: string = created.body.workbook.id;
  const before = await owner.agent.get(`/api/workbooks/${workbookId}`);
  const upload = await owner.agent.post('/api/imports').field('workbookId', workbookId).attach('file', Buffer.from(sdf), 'ligands.sdf');

  it('adds the records as a new sheet in one revision, reporting the damaged record by number', async () => {
    expect(upload.status, JSON.stringify(upload.body)).toBe(201);
    expect(upload.body.revision).toBe(before.body.revision + 1);
    expect(upload.body.summary.skipped.map((s: { reason: string }) => s.reason)).toEqual([expect.stringMatching(/^record 2: /)]);
    const loaded = await owner.agent.get(`/api/workbooks/${workbookId}`);
    expect(loaded.body.sheets.map((s: { name: string }) => s.name)).toEqual(['Screen1', 'ligands']);
  });

  it('computes the EHT columns from the file’s own coordinates', async () => {
    const values = await owner.agent.get(`/api/workbooks/${workbookId}/values`);
    const sheet = values.body.sheets.find((s: { name: string }) => s.name === 'ligands');
    const value = (r: number, c: number) => sheet.values.find(([row, col]: [number, number]) => row === r && col === c)?.[2];
    // Water's HOMO is the out-of-plane O 2p lone pair, non-bonding, so it sits at O's H_pp = −14.8 eV
    // (R. Hoffmann, J. Chem. Phys. 39, 1397 (1963), parameter table).
    expect(value(1, 4)).toBeCloseTo(-14.8, 6);
    expect(value(2, 6)).toBeGreaterThan(0); // methane's gap
  });

  it('refuses a damaged-only upload with nothing stored', async () => {
    const res = await owner.agent.post('/api/imports').field('workbookId', workbookId).attach('file', Buffer.from('\0\0binary'), 'bad.xyz');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/binary data/);
    const loaded = await owner.agent.get(`/api/workbooks/${workbookId}`);
    expect(loaded.body.revision).toBe(upload.body.revision);
  });

  const binary = (res: unknown, done: (err: Error | null, body: Buffer) => void) => {
    const stream = res as NodeJS.ReadableStream;
    const chunks: Buffer[] = [];
    stream.on('data', (c: Buffer) => chunks.push(Buffer.from(c)));
    stream.on('end', () => done(null, Buffer.concat(chunks)));
  };

  it('keeps the record text exactly through an xlsx export and re-import', async () => {
    const exported = await owner.agent.get(`/api/workbooks/${workbookId}/export?format=xlsx`).buffer(true).parse(binary);
    expect(exported.status).toBe(200);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(exported.body as unknown as ArrayBuffer);
    const ws = wb.getWorksheet('ligands')!;
    expect(ws.getCell('D2').value).toBe(water);
    expect(ws.getCell('A3').value).toBe('methane');
    const again = await owner.agent.post('/api/imports').attach('file', exported.body as Buffer, 'round trip.xlsx');
    expect(again.status, JSON.stringify(again.body)).toBe(201);
    const reloaded = await owner.agent.get(`/api/workbooks/${again.body.workbookId}`);
    const sheet = reloaded.body.sheets.find((s: { name: string }) => s.name === 'ligands');
    expect(sheet.cells).toContainEqual([1, 3, water]);
    expect(sheet.cells).toContainEqual([1, 4, '=EHTHOMO(D2)']);
  });

  it('keeps the record text exactly through a CSV export', async () => {
    const csv = await owner.agent.get(`/api/workbooks/${workbookId}/export?format=csv&sheet=ligands`).buffer(true).parse(binary);
    expect(csv.status).toBe(200);
    const again = await owner.agent.post('/api/imports').attach('file', csv.body as Buffer, 'ligands.csv');
    expect(again.status, JSON.stringify(again.body)).toBe(201);
    const reloaded = await owner.agent.get(`/api/workbooks/${again.body.workbookId}`);
    expect(reloaded.body.sheets[0].cells).toContainEqual([1, 3, water]);
    expect(reloaded.body.sheets[0].cells).toContainEqual([2, 3, methane]);
  });
});
