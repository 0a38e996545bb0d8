// Structure files in and out: SDF/MOL/XYZ uploads become a sheet with one row per record (name,
// SMILES, formula, the record itself, extended-Hückel columns reading it); damaged records are
// reported by number while the rest are taken; nothing is stored when the file is refused; xlsx and
// CSV exports keep the record text exactly.
import ExcelJS from 'exceljs';
import { Molecule } from 'openchemlib';
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

// Frames for bond perception. Formaldehyde: r(CO) 1.205 Å, r(CH) 1.111 Å, ∠HCH 116.1°; hydroxide:
// r(OH) 0.964 Å; the methyl radical: planar, r(CH) 1.079 Å (NIST CCCBDB; all recalled from memory).
const hc = (r: number, angleDeg: number, sign: number) => (sign * r * Math.sin((angleDeg / 2) * (Math.PI / 180))).toFixed(4);
const hz = (r: number, angleDeg: number) => (-r * Math.cos((angleDeg / 2) * (Math.PI / 180))).toFixed(4);
const bondFrames = [
  ['3', 'water', 'O 0 0 0', 'H 0.7574 0 0.5864', 'H -0.7574 0 0.5864'],
  ['4', 'formaldehyde', 'C 0 0 0', 'O 0 0 1.205', `H ${hc(1.111, 116.1, 1)} 0 ${hz(1.111, 116.1)}`, `H ${hc(1.111, 116.1, -1)} 0 ${hz(1.111, 116.1)}`],
  ['2', 'hydroxide charge=-1', 'O 0 0 0', 'H 0 0 0.964'],
  ['4', 'methyl radical', 'C 0 0 0', 'H 1.079 0 0', 'H -0.5395 0.9344 0', 'H -0.5395 -0.9344 0'],
  ['2', 'typo', 'O 0 0 0', 'H 0 0 0.096'],
]
  .map((f) => f.join('\n'))
  .join('\n');
const idCode = (smiles: string) => Molecule.fromSmiles(smiles).getIDCode();

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
    expect(idCode(String(at(1, 1)))).toBe(idCode('O'));
    expect(at(2, 0)).toBe('hydrogen');
    expect(at(2, 2)).toBe('H2');
    expect(idCode(String(at(2, 1)))).toBe(idCode('[H][H]'));
    expect(parsed.summary.skipped).toEqual([expect.objectContaining({ reason: expect.stringMatching(/^record 2: atom line 2 "Q x y z" is not "element x y z"/) })]);
  });

  it('gives XYZ frames SMILES from bonds perceived in their coordinates, and says which frames got none', () => {
    const parsed = readStructures(bytes(bondFrames), 'bonds.xyz', 'xyz');
    const cells = parsed.sheets[0].cells;
    const at = (r: number, c: number) => cells.find(([row, col]) => row === r && col === c)?.[2];
    expect([1, 2, 3, 4, 5].map((r) => at(r, 0))).toEqual(['water', 'formaldehyde', 'hydroxide charge=-1', 'methyl radical', 'typo']);
    expect(idCode(String(at(1, 1)))).toBe(idCode('O'));
    expect(idCode(String(at(2, 1)))).toBe(idCode('C=O'));
    expect(idCode(String(at(3, 1)))).toBe(idCode('[OH-]'));
    // Bonds that cannot be perceived leave the SMILES empty; the row, its formula and its EHT columns stay.
    expect(at(4, 1)).toBeUndefined();
    expect(at(5, 1)).toBeUndefined();
    expect([2, 3, 4, 5].map((r) => at(r, 2))).toEqual(['CH2O', 'HO', 'CH3', 'HO']);
    for (let r = 1; r <= 5; r++) {
      expect(at(r, 3)).toMatch(/^\d+\n/);
      // The charge from the comment line reaches the EHT formulas too.
      expect(at(r, 4)).toBe(r === 3 ? '=EHTHOMO(D4,-1)' : `=EHTHOMO(D${r + 1})`);
    }
    expect(parsed.summary.skipped).toEqual([]);
    expect(parsed.summary.notes).toEqual([
      expect.stringMatching(/^XYZ frames carry no bonds: 3 of 5 frames got bonds and SMILES perceived from their coordinates \(a heuristic/),
      expect.stringMatching(/^record 4 \("methyl radical"\): SMILES left empty, bonds uncertain: an odd number of electrons/),
      expect.stringMatching(/^record 5 \("typo"\): SMILES left empty, atoms 1 \(O\) and 2 \(H\) are 0\.096 Å apart/),
    ]);
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

  it('computes the EHT columns of XYZ frames from their own coordinates, with their perceived SMILES beside', async () => {
    const res = await owner.agent.post('/api/imports').attach('file', Buffer.from(bondFrames), 'bonds.xyz');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const values = await owner.agent.get(`/api/workbooks/${res.body.workbookId}/values`);
    const sheet = values.body.sheets.find((s: { name: string }) => s.name === 'bonds');
    const value = (r: number, c: number) => sheet.values.find(([row, col]: [number, number]) => row === r && col === c)?.[2];
    expect(value(1, 1)).toBe('O');
    // As for the molfile above: water's HOMO is the O 2p lone pair at H_pp = −14.8 eV (Hoffmann 1963).
    expect(value(1, 4)).toBeCloseTo(-14.8, 6);
    expect(value(3, 6)).toBeGreaterThan(0); // hydroxide, solved as the anion its comment names
    expect(value(4, 6)).toBeGreaterThan(0); // the methyl radical, SMILES empty, still has its gap from the record
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
