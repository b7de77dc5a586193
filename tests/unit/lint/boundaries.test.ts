import { beforeAll, describe, expect, it } from 'vitest';
import { ESLint } from 'eslint';
import { join } from 'node:path';

// The boundary rules of eslint.config.js, run through ESLint's Node API on small in-memory
// sources placed at real paths of the tree: each rule must fire on a deliberate violation and
// stay quiet on the lawful import beside it.
const root = join(import.meta.dirname, '../../..');
let eslint: ESLint;

beforeAll(() => {
  eslint = new ESLint({ cwd: root });
});

const BOUNDARY_RULES = new Set(['no-restricted-imports', 'no-restricted-globals', 'no-restricted-syntax']);

/** The boundary rules that fire on `code` placed at `file` (a path inside the repository). */
async function boundaryHits(file: string, code: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath: join(root, file) });
  return result.messages.filter((m) => m.ruleId !== null && BOUNDARY_RULES.has(m.ruleId)).map((m) => m.ruleId as string);
}

describe('shared/ imports nothing from the layers above it', () => {
  it.each([
    ['shared/numeric/score.ts', "import { x } from '../../src/lib/api';"],
    ['shared/numeric/score.ts', "import { x } from '../../server/app';"],
    ['shared/link/frame.ts', "import { x } from '../../cli/run';"],
    ['shared/link/frame.ts', "import { x } from '../../mock-device/options';"],
    ['shared/link-engine/limits.ts', "import { x } from '../../src/features/bench/live/bench-controller';"],
    ['shared/link-engine/limits.ts', "export { x } from '../../server/db/models';"],
  ])('%s: %s is refused', async (file, code) => {
    expect(await boundaryHits(file, `${code}\nexport const y = x;\n`)).toEqual(['no-restricted-imports']);
  });

  it.each([
    ['shared/link-engine/limits.ts', "import { x } from '../link/crc8';"],
    ['shared/numeric/score.ts', "import { x } from './exact-reference';"],
    ['shared/numeric/score.ts', "import { x } from 'zod';"],
  ])('%s: %s is lawful', async (file, code) => {
    expect(await boundaryHits(file, `${code}\nexport const y = x;\n`)).toEqual([]);
  });
});

describe('shared/ uses no Node built-in, with or without node:', () => {
  it.each(['node:fs', 'fs', 'fs/promises', 'crypto', 'events', 'stream', 'buffer', 'node:crypto', 'path/posix', 'worker_threads'])(
    '%s is refused',
    async (name) => {
      expect(await boundaryHits('shared/link/crc8.ts', `import * as m from '${name}';\nexport const y = m;\n`)).toEqual(['no-restricted-imports']);
    },
  );

  it('a package whose name merely starts like a built-in is lawful', async () => {
    // 'fft.js' and 'events-like' are not built-ins; only exact names and their sub-paths are.
    expect(await boundaryHits('shared/numeric/spectral.ts', "import a from 'fft.js';\nimport b from 'events-like';\nexport const y = [a, b];\n")).toEqual([]);
  });
});

describe('shared/ touches no DOM, no host global and no timer', () => {
  it.each([
    'document.title',
    'window.location.href',
    'navigator.serial',
    'localStorage.getItem("k")',
    'setTimeout(() => 0, 1)',
    'setInterval(() => 0, 1)',
    'queueMicrotask(() => 0)',
    'requestAnimationFrame(() => 0)',
    'process.env.HOME',
    'Buffer.from([1])',
    'fetch("/api")',
  ])('%s is refused', async (expr) => {
    expect(await boundaryHits('shared/link-engine/link-engine.ts', `export const y = ${expr};\n`)).toEqual(['no-restricted-globals']);
  });

  it.each(['globalThis.setTimeout(() => 0, 1)', 'Date.now()', 'new Date()'])('%s is refused', async (expr) => {
    expect(await boundaryHits('shared/link-engine/link-engine.ts', `export const y = ${expr};\n`)).toEqual(['no-restricted-syntax']);
  });

  it('the language itself is lawful', async () => {
    const code = 'export const y = [Math.PI, new Date(0).getTime(), new Uint8Array(2), JSON.stringify({}), new Map(), BigInt(3)];\n';
    expect(await boundaryHits('shared/numeric/score.ts', code)).toEqual([]);
  });
});

describe('features do not import each other', () => {
  it.each([
    // At every depth below a feature's root, written as the code writes it (bench/index.ts and
    // sessions/list/parts/row.tsx are files a feature could add at depths 0 and 2).
    ['src/features/bench/index.ts', "import { x } from '../sessions/api/get-sessions';"],
    ['src/features/bench/components/bench-page.tsx', "import { x } from '../../sessions/components/verdict-badges';"],
    ['src/features/bench/live/bench-controller.ts', "import { x } from '../../builds/api/get-builds';"],
    ['src/features/sessions/detail/session-page.tsx', "import { x } from '../../compare/api/get-diff';"],
    ['src/features/sessions/list/parts/row.tsx', "import { x } from '../../../bench/live/bench-controller';"],
    ['src/features/cores/components/core-page.tsx', "import { x } from '../../../features/boards/components/boards-page';"],
    ['src/features/cores/components/core-page.tsx', "import { x } from '../../../../src/features/boards/components/boards-page';"],
  ])('%s: %s is refused', async (file, code) => {
    expect(await boundaryHits(file, `${code}\nexport const y = x;\n`)).toEqual(['no-restricted-imports']);
  });

  it.each([
    // The documented exception: auth, who is signed in, which every page needs.
    ['src/features/builds/components/build-page.tsx', "import { x } from '../../auth/api/get-me';"],
    ['src/features/sessions/detail/session-page.tsx', "import { x } from '../../auth/api/get-me';"],
    // Inside the feature itself, and down into lib/, components/ and shared/.
    ['src/features/bench/components/bench-page.tsx', "import { x } from '../live/bench-controller';"],
    ['src/features/bench/components/bench-page.tsx', "import { x } from './plan-form';"],
    ['src/features/sessions/detail/session-page.tsx', "import { x } from '../../../lib/resources/builds';"],
    ['src/features/sessions/detail/session-page.tsx', "import { x } from '../../../components/data-table';"],
    ['src/features/bench/live/bench-controller.ts', "import { x } from '../../../../shared/link-engine';"],
    ['src/features/bench/index.ts', "import { x } from './live/bench-controller';"],
  ])('%s: %s is lawful', async (file, code) => {
    expect(await boundaryHits(file, `${code}\nexport const y = x;\n`)).toEqual([]);
  });

  it('src/app/ composes features freely', async () => {
    const code = "import { a } from '../../features/sessions/list/sessions-page';\nimport { b } from '../../features/bench/components/bench-page';\nexport const y = [a, b];\n";
    expect(await boundaryHits('src/app/routes/sessions.tsx', code)).toEqual([]);
  });
});

describe('lib/ and components/ import no feature', () => {
  it.each([
    ['src/lib/resources/builds.ts', "import { x } from '../../features/builds/api/get-builds';"],
    ['src/lib/api.ts', "import { x } from '../features/auth/api/get-me';"],
    ['src/components/charts/signal-charts.tsx', "import { x } from '../../features/sessions/scoring/x';"],
    ['src/components/data-table.tsx', "import { x } from '../features/auth/api/get-me';"],
  ])('%s: %s is refused', async (file, code) => {
    expect(await boundaryHits(file, `${code}\nexport const y = x;\n`)).toEqual(['no-restricted-imports']);
  });

  it.each([
    ['src/lib/resources/builds.ts', "import { x } from '../api';"],
    ['src/components/charts/signal-charts.tsx', "import { x } from '../data-table';"],
    ['src/components/data-table.tsx', "import { x } from '../../shared/numeric';"],
  ])('%s: %s is lawful', async (file, code) => {
    expect(await boundaryHits(file, `${code}\nexport const y = x;\n`)).toEqual([]);
  });
});
