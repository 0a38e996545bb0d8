import { DenseSparseChooseBasedOnThreshold, HyperFormula, type ConfigParams } from 'hyperformula';
import { installEngineGuards } from './engineGuards.js';
import { installSharedTrees } from './engineSharedTrees.js';
import { installTopSort } from './engineTopSort.js';
import { engineInput } from './formulaTokens.js';
import { registerOrbitabPlugin } from './plugin.js';

export type SheetInput = (string | number | boolean | null)[][];

/** The settings every Orbitab engine shares (client, server, CLI). */
export const engineConfig: Partial<ConfigParams> = {
  licenseKey: 'gpl-v3',
  // HyperFormula's default limit is 40,000 rows; screening sheets can be longer.
  maxRows: 1_000_000,
  maxColumns: 2_000,
  useArrayArithmetic: true,
  precisionRounding: 12,
  smartRounding: true,
  // A sheet whose inputs fill under a tenth of their bounding box (one value far down, say) is kept
  // in sparse maps rather than row arrays sized to that box.
  chooseAddressMappingPolicy: new DenseSparseChooseBasedOnThreshold(0.1),
};

/**
 * The one-time set-up every engine needs, step by step. createEngine runs whatever has not run; a page
 * runs them ahead, each in a task of its own (src/core/workbook/session/engineSetup.ts), since together
 * with a first build they held the page for a long task.
 */
export const engineSetupSteps: readonly (() => void)[] = [installEngineGuards, installSharedTrees, installTopSort, registerOrbitabPlugin];

export function createEngine(sheets: Record<string, SheetInput>, options: Partial<ConfigParams> = {}): HyperFormula {
  installEngineGuards();
  installSharedTrees();
  installTopSort();
  registerOrbitabPlugin();
  // Stored formulas keep the exponent the user (or another program) wrote, 6.022E23 included; the
  // engine reads only a lowercase e, so it is given that (functions/formulaTokens.ts).
  const read = Object.fromEntries(Object.entries(sheets).map(([name, rows]) => [name, rows.map((row) => row.map(engineInput))]));
  return HyperFormula.buildFromSheets(read, { ...engineConfig, ...options });
}
