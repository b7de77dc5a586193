// `anglebench --version`: the version in the package's own package.json, wherever it is installed.
import { readFileSync } from 'node:fs';

export function packageVersion(): string {
  const pkg = JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')) as { name?: string; version?: string };
  if (typeof pkg.version !== 'string') throw new Error('package.json has no version');
  return pkg.version;
}
