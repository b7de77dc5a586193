import { builtinModules } from 'node:module';
import { readdirSync } from 'node:fs';
import js from '@eslint/js';
import globals from 'globals';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';

// ---- Boundaries (DEVELOPERS.md, "Dependencies point inward") ----------------------------------
// no-restricted-imports matches the import string as written, so each pattern below is written
// against the relative paths the code really uses ('../../src/…', 'node:fs', 'crypto', …).

const TS_FILES = '*.{ts,tsx}';
const escape = (s) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/** shared/: the domain, importable by the browser, the server and the runner alike. */
const topBuiltins = builtinModules.filter((m) => !m.includes('/'));
const sharedImports = {
  paths: topBuiltins.map((name) => ({ name, message: 'shared/ is pure: no Node built-ins (pass the data in instead).' })),
  patterns: [
    { regex: '^node:', message: 'shared/ is pure: no Node built-ins (pass the data in instead).' },
    // fs/promises, path/posix, …: a built-in's sub-path is a built-in too.
    { regex: `^(${topBuiltins.map(escape).join('|')})/`, message: 'shared/ is pure: no Node built-ins.' },
    { regex: '(^|/)(src|server|cli|mock-device)(/|$)', message: 'shared/ imports nothing from src/, server/, cli/ or mock-device/: dependencies point inward.' },
  ],
};

// Every global the browser or Node adds on top of the language: DOM, timers, process, Buffer, fetch…
// (shared/link/text-codec.ts declares the two Encoding API classes it needs for itself).
const language = new Set(Object.keys(globals.es2023));
const hostGlobals = [...new Set([...Object.keys(globals.browser), ...Object.keys(globals.node)])]
  .filter((name) => !language.has(name))
  .map((name) => ({ name, message: `shared/ is pure: no DOM, Node or timer globals ("${name}"); take what you need as an argument.` }));

/**
 * A feature imports no other feature, except `auth` (who is signed in, which every page needs).
 * A file `depth` folders below its feature's root reaches a sibling feature with depth+1 '../'.
 */
const FEATURE_EXCEPTIONS = ['auth'];
const FEATURES = readdirSync(new URL('./src/features', import.meta.url), { withFileTypes: true })
  .filter((d) => d.isDirectory())
  .map((d) => d.name);
const MAX_DEPTH = 4;

function featureBlocks(feature) {
  const allowed = [feature, ...FEATURE_EXCEPTIONS].map(escape).join('|');
  const message = `features do not import each other (only ${FEATURE_EXCEPTIONS.join(', ')}): move what "${feature}" shares to src/lib, src/components or shared/, or compose the features in src/app/.`;
  const blocks = [];
  for (let depth = 0; depth <= MAX_DEPTH; depth += 1) {
    const up = '\\.\\./'.repeat(depth + 1);
    blocks.push({
      files: [`src/features/${feature}/${'*/'.repeat(depth)}${TS_FILES}`],
      rules: {
        'no-restricted-imports': ['error', {
          patterns: [
            // ../<other>/… from the feature's folders, ../../features/<other>/… or …/src/features/<other>/… from anywhere.
            { regex: `^${up}(?!(${allowed})(/|$))[^./][^/]*`, message },
            { regex: `(^|/)features/(?!(${allowed})(/|$))`, message },
          ],
        }],
      },
    });
  }
  return blocks;
}

export default tseslint.config(
  { ignores: ['dist', 'node_modules', 'data', 'coverage', 'benchmarks/results'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.browser, ...globals.node } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
    },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: reactHooks.configs.recommended.rules,
  },
  {
    // The domain stays free of I/O (tsconfig.shared.json also compiles it without DOM or Node types).
    files: ['shared/**/*.ts'],
    languageOptions: { globals: { ...globals.es2023 } },
    rules: {
      'no-restricted-imports': ['error', sharedImports],
      'no-restricted-globals': ['error', ...hostGlobals],
      'no-restricted-syntax': [
        'error',
        { selector: "MemberExpression[object.name='globalThis']", message: 'shared/ is pure: no host globals through globalThis.' },
        { selector: "CallExpression[callee.object.name='Date'][callee.property.name='now']", message: 'shared/ reads no clock: take the time as an argument.' },
        { selector: "NewExpression[callee.name='Date'][arguments.length=0]", message: 'shared/ reads no clock: take the time as an argument.' },
      ],
    },
  },
  ...FEATURES.flatMap(featureBlocks),
  {
    // lib/ and components/ sit below the features: they import none.
    files: ['src/lib/**/*.{ts,tsx}', 'src/components/**/*.{ts,tsx}'],
    rules: {
      'no-restricted-imports': ['error', {
        patterns: [{ regex: '(^|/)features(/|$)', message: 'src/lib and src/components import no feature: features build on them, not the other way.' }],
      }],
    },
  },
);
