// Writes docs/functions.md from the catalog: `npm run docs:functions`.
// tests/docs-fresh.test.ts fails when the committed file differs from renderFunctionsMarkdown().
import { writeFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { FAMILY_ORDER, functionHelp, type FunctionHelp, type ParamHelp } from './help.js';
import type { Family } from './catalog/types.js';
import { count, evaluationLimits as L } from './limits.js';
import { engineConfig } from './engine.js';

export const FUNCTIONS_DOC_PATH = resolve(dirname(fileURLToPath(import.meta.url)), '..', 'docs', 'functions.md');

const FAMILY_INTRO: Record<Family, string> = {
  Diatomic: 'Valence MO analysis of a diatomic species written as text (`O2`, `NO+`, `CN-`): configuration, bond order, unpaired electrons, magnetism, ground term.',
  LCAO: 'Two-centre LCAO: overlap of 1s orbitals, the H2+ potential curve, the 2×2 secular problem and HOMO–LUMO gaps. Atomic units (bohr, hartree) unless a unit argument says otherwise.',
  Hückel: 'Hückel π-electron theory for conjugated systems.',
  'Extended Hückel': 'All-valence-electron extended-Hückel theory (Hoffmann 1963) from a 3D structure: SMILES (a generated conformer), XYZ text or a molfile. Energies in eV; a qualitative, non-self-consistent model. Method, parameters and limits: docs/eht.md.',
  'π spectra': 'π→π* excitation energies, wavelengths and oscillator strengths by the Pariser–Parr–Pople model with single-excitation CI, from SMILES. Model estimates for screening, not measured spectra: see docs/spectra.md for the error table.',
  Units: 'Conversions with CODATA 2018 constants, and bond-length relations.',
};

export const CAUTIONS =
  'Results are model estimates from published approximate methods, not measurements. They are not a basis for ' +
  'safety decisions about reactive, toxic or energetic species: defer to safety data sheets, local regulations ' +
  'and qualified review before handling any substance.';

/** Markdown table cells may not contain a bare pipe or a line break. */
const cell = (text: string) => text.replace(/\|/g, '\\|').replace(/\n/g, ' ');

function paramRow(p: ParamHelp): string {
  const details = [p.description];
  if (p.choices) details.push(`One of ${p.choices.map((c) => `\`${c}\``).join(', ')}.`);
  const required = p.optional ? `optional${p.default !== undefined ? `, default \`${String(p.default)}\`` : ''}` : 'required';
  return `| \`${p.name}\` | ${p.type} | ${cell(p.unit ?? '—')} | ${required} | ${cell(details.join(' '))} |`;
}

function renderFunction(h: FunctionHelp): string {
  const lines = [`### ${h.name}`, '', `\`${h.signature}\``, '', h.summary, ''];
  if (h.params.length > 0) {
    lines.push('| parameter | type | unit | | description |', '| --- | --- | --- | --- | --- |', ...h.params.map(paramRow), '');
  } else {
    lines.push('No parameters.', '');
  }
  const sentence = (text: string) => (/[.!?)]$/.test(text.trim()) ? text.trim() : `${text.trim()}.`);
  const unit = h.returns.unit ? ` Unit: ${h.returns.unit}.` : '';
  lines.push(`**Returns** (${h.returns.kind}${h.spills ? ', may spill' : ''}): ${sentence(h.returns.description)}${unit}`, '');
  lines.push('**Examples**', '');
  for (const e of h.examples) {
    const arrow = e.approximate ? '≈' : '→';
    lines.push(`- \`${e.formula}\` ${arrow} \`${e.expectedText}\`${e.note ? ` — ${e.note}` : ''}`);
  }
  lines.push('', `**Source:** ${h.source}`, '');
  if (h.seeAlso.length > 0) lines.push(`**See also:** ${h.seeAlso.map((n) => `[${n}](#${n.toLowerCase()})`).join(', ')}`, '');
  return lines.join('\n');
}

export function renderFunctionsMarkdown(help: FunctionHelp[] = functionHelp()): string {
  const families = [...FAMILY_ORDER, ...new Set(help.map((h) => h.family))].filter(
    (f, i, all) => all.indexOf(f) === i && help.some((h) => h.family === f),
  );
  const out = [
    '# Orbitab cell functions',
    '',
    '<!-- Generated from functions/catalog by `npm run docs:functions`. Do not edit by hand: tests fail when this file is stale. -->',
    '',
    `**Cautions.** ${CAUTIONS}`,
    '',
    'Errors are cell values: `#VALUE!` for a wrong kind of argument (unknown species or unit, text where a number belongs, an empty cell where a number is required) ' +
      'and for an electron count the levels cannot hold (too many electrons, none, or every level full), ' +
      '`#NUM!` for a number outside what the model allows (negative distance, |S| ≥ 1), each with a message naming what is wrong. ' +
      'A function that spills a table returns a single value when its trailing selector arguments are given.',
    '',
    `**Limits.** So that no cell can stall a colleague's tab or the server, a formula may spill at most ${count(L.maxSpillCells)} cells, ` +
      `cover at most ${count(L.maxRangeCells)} cells with its ranges (a whole column counts as the full ${count(engineConfig.maxRows!)}-row grid, so write a bounded range such as \`B1:B5000\`), ` +
      `make text of at most ${count(L.maxTextLength)} characters and chain at most ${count(L.maxFormulaOperators)} operators. ` +
      `The Hückel family solves at most ${L.maxPiCentres} π centres (and reads SMILES of at most ${L.maxSmilesAtoms} heavy atoms); ` +
      `SECULAR, ORBITAL and a Hückel matrix range take at most ${L.maxMatrixSize} × ${L.maxMatrixSize}. ` +
      'Past a limit the cell shows `#VALUE!` with a message naming it; the rest of the workbook computes as usual.',
    '',
    '## Contents',
    '',
    ...families.map((f) => `- **${f}**: ${help.filter((h) => h.family === f).map((h) => `[${h.name}](#${h.name.toLowerCase()})`).join(', ')}`),
    '',
  ];
  for (const family of families) {
    out.push(`## ${family}`, '', FAMILY_INTRO[family] ?? '', '');
    for (const h of help.filter((x) => x.family === family)) out.push(renderFunction(h));
  }
  return out.join('\n').replace(/\n{3,}/g, '\n\n').trimEnd() + '\n';
}

export function writeFunctionsDoc(path = FUNCTIONS_DOC_PATH): string {
  const markdown = renderFunctionsMarkdown();
  writeFileSync(path, markdown, 'utf8');
  return path;
}

if (process.argv[1] && import.meta.url === pathToFileURL(resolve(process.argv[1])).href) {
  const path = writeFunctionsDoc();
  console.log(`wrote ${path} (${functionHelp().length} functions)`);
}
