// Functions whose value depends on the clock or on chance (NOW, TODAY, RAND, RANDBETWEEN…): a value
// computed once is not the value of the next reading, so stored values of a workbook calling one
// are recomputed on every read. The list is the engine's own (each plugin marks its volatile
// functions), so a function added later is covered without a list kept here.
import { HyperFormula } from 'hyperformula';
import { registerOrbitabPlugin } from './plugin.js';

let pattern: RegExp | null = null;

/** The names of every volatile function the engine knows, upper case. */
export function volatileFunctionNames(): string[] {
  registerOrbitabPlugin();
  return HyperFormula.getRegisteredFunctionNames('enGB').filter((name) => {
    const plugin = HyperFormula.getFunctionPlugin(name) as { implementedFunctions?: Record<string, { isVolatile?: boolean }> } | undefined;
    return plugin?.implementedFunctions?.[name]?.isVolatile === true;
  });
}

/** Whether a formula calls a volatile function (names inside string literals do not count). */
export function callsVolatileFunction(input: string): boolean {
  if (input.charCodeAt(0) !== 61 /* = */) return false;
  pattern ??= new RegExp(`(?<![A-Za-z0-9_.])(?:${volatileFunctionNames().join('|')})\\s*\\(`, 'i');
  const code = input.includes('"') ? input.replace(/"(?:[^"]|"")*"/g, '""') : input;
  return pattern.test(code);
}
