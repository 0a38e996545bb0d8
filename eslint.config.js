// Lint: the import boundaries of the house, enforced. TypeScript is parsed by Babel's parser
// (typescript-eslint needs TypeScript < 6.1; the project builds with TypeScript 7), resolved by
// eslint-import-resolver-typescript, and checked by eslint-plugin-import-x:
//   functions/chem/ ← functions/ ← shared/ ← server/, src/   (server/ and src/ never import each other)
//   src: lib, components ← core ← features ← app; a feature never imports another feature.
import babelParser from '@babel/eslint-parser';
import importX from 'eslint-plugin-import-x';
import reactHooks from 'eslint-plugin-react-hooks';
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript';
import fs from 'node:fs';

const features = fs.readdirSync('src/features');

/** Each zone: files under `target` may not import files under `from` (except `except`, relative to `from`). */
const zones = [
  { target: './functions/chem', from: ['./functions/catalog', './functions/plugin.ts', './functions/engine.ts', './functions/index.ts', './functions/limits.ts', './functions/docs.ts', './functions/help.ts', './shared', './server', './src'], message: 'functions/chem is the science core: it imports nothing of ours.' },
  { target: './functions', from: ['./shared', './server', './src', './tests', './bench'], message: 'functions/ imports no other folder of ours.' },
  { target: './shared', from: ['./server', './src'], message: 'shared/ is imported by server/ and src/, never the reverse.' },
  { target: './server', from: './src', message: 'The server never imports the client.' },
  { target: './src', from: './server', message: 'The client never imports the server.' },
  { target: ['./src/lib', './src/components'], from: ['./src/core', './src/features', './src/app'], message: 'lib/ and components/ are the bottom of the client.' },
  { target: './src/core', from: ['./src/features', './src/app'], message: 'core/ (workbook session, model, save queue, team state) is shared by features: it imports none.' },
  { target: './src/features', from: './src/app', message: 'Features are composed by the app, never the reverse.' },
  ...features.map((f) => ({
    target: `./src/features/${f}`,
    from: './src/features',
    except: [`./${f}`],
    message: 'A feature does not import another feature: move what both need into src/core, or compose them in src/app.',
  })),
];

export default [
  { ignores: ['dist/**', 'node_modules/**', 'coverage/**', 'tests/artifacts/**', 'bench/results/**', 'drizzle/**'] },
  {
    files: ['**/*.ts', '**/*.tsx'],
    languageOptions: {
      parser: babelParser,
      parserOptions: {
        requireConfigFile: false,
        babelOptions: { babelrc: false, configFile: false, presets: [['@babel/preset-typescript', { isTSX: true, allExtensions: true }], '@babel/preset-react'] },
      },
    },
    plugins: { 'import-x': importX, 'react-hooks': reactHooks },
    settings: { 'import-x/resolver-next': [createTypeScriptImportResolver({ project: './tsconfig.json' })] },
    linterOptions: { reportUnusedDisableDirectives: 'error' },
    rules: {
      'import-x/no-cycle': 'error',
      'import-x/no-restricted-paths': ['error', { zones }],
      'import-x/no-unresolved': 'error',
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'warn',
      'no-control-regex': 'error',
    },
  },
];
