// The one caution that goes with every computed chemistry result: in the app's function reference,
// under the workbook grid, and on the front sheet of every export. Written once here so the three
// places cannot drift apart; each shows it once.

/** The heading where there is room for one. */
export const cautionTitle = 'Model estimates, not measurements';

/** The caution as separate sentences (an export writes one per row). */
export const cautionLines: readonly string[] = [
  'Results of Orbitab’s chemistry functions are model estimates (qualitative molecular-orbital filling, two-centre LCAO, simple Hückel theory, PPP π spectra, extended-Hückel theory), not measurements, and not a basis for safety decisions.',
  'For reactive or toxic species (for example fluorine, superoxides, peroxides), defer to safety data sheets, local regulations and qualified review.',
];

/** The caution as one paragraph. */
export const cautionText = cautionLines.join(' ');
