// `cli eval`: evaluates formulas with the same engine and catalog as the app, without a server.
import { evaluateStandalone, type CellScalar, type FormulaOutcome } from './evaluate.js';
import { EXIT_FAILED, EXIT_OK, EXIT_USAGE, type CliCommand, type CliIO } from './io.js';

export const evalUsage = `Usage: cli eval [--json] <formula> [<formula> ...]

Evaluates each formula in a scratch engine with every Orbitab cell function, e.g.
  npm run --silent cli -- eval '=BONDORDER("O2")'            prints 2
  npm run --silent cli -- eval --json '=BONDORDER("O2")'     prints {"value":2}
A leading "=" is optional. Quote each formula for the shell. Formulas are independent: they
cannot refer to one another.

Output, one result per formula, in order:
  plain   a value per line; a spilled table as tab-separated rows, one line per row;
          an error as "#VALUE!<TAB>message"
  --json  one JSON object per line: {"value":2}, {"value":[[-18.88],[-4.8]]} for a spill,
          or {"error":"#VALUE!","message":"..."}

Exit status: 0 when every formula gives a value, 1 when any gives an error (all are still
printed), 2 for a usage error (no formula, unknown option).`;

function plainCell(value: CellScalar): string {
  if (typeof value === 'boolean') return value ? 'TRUE' : 'FALSE';
  return String(value);
}

function formatPlain(outcome: FormulaOutcome): string {
  if ('error' in outcome) return `${outcome.error}\t${outcome.message}`;
  if (Array.isArray(outcome.value)) return outcome.value.map((row) => row.map(plainCell).join('\t')).join('\n');
  return plainCell(outcome.value);
}

function formatJson(outcome: FormulaOutcome): string {
  return JSON.stringify('error' in outcome ? { error: outcome.error, message: outcome.message } : { value: outcome.value });
}

export function runEval(args: string[], io: CliIO): number {
  let json = false;
  const formulas: string[] = [];
  let optionsEnded = false;
  for (const arg of args) {
    if (!optionsEnded && arg === '--') optionsEnded = true;
    else if (!optionsEnded && arg === '--json') json = true;
    else if (!optionsEnded && (arg === '--help' || arg === '-h')) {
      io.stdout(evalUsage);
      return EXIT_OK;
    } else if (!optionsEnded && arg.startsWith('--')) {
      io.stderr(`cli eval: unknown option '${arg}'\n\n${evalUsage}`);
      return EXIT_USAGE;
    } else formulas.push(arg);
  }
  const empty = formulas.findIndex((f) => f.trim() === '' || f.trim() === '=');
  if (formulas.length === 0 || empty !== -1) {
    io.stderr(`cli eval: ${formulas.length === 0 ? 'give at least one formula' : `formula ${empty + 1} is empty`}\n\n${evalUsage}`);
    return EXIT_USAGE;
  }
  const outcomes = evaluateStandalone(formulas);
  for (const outcome of outcomes) io.stdout(json ? formatJson(outcome) : formatPlain(outcome));
  return outcomes.some((o) => 'error' in o) ? EXIT_FAILED : EXIT_OK;
}

export const evalCommand: CliCommand = {
  summary: 'evaluate formulas with the Orbitab cell functions and print the values',
  usage: evalUsage,
  run: runEval,
};
