export { catalog, catalogByName } from './catalog/index.js';
export * from './catalog/types.js';
export { createEngine, engineConfig, type SheetInput } from './engine.js';
export { engineInput, lowercaseExponents } from './formulaTokens.js';
export { registerOrbitabPlugin, callEntry } from './plugin.js';
