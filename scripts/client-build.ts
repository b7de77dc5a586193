import fs from 'node:fs';
import path from 'node:path';
import { build } from 'vite';
import { clientDistDir, projectRoot } from '../server/paths';

function newestMtimeMs(target: string): number {
  const stat = fs.statSync(target);
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = stat.mtimeMs;
  for (const entry of fs.readdirSync(target)) newest = Math.max(newest, newestMtimeMs(path.join(target, entry)));
  return newest;
}

/** True when dist/ is missing or older than anything the client is built from. */
export function clientIsStale(): boolean {
  const built = path.join(clientDistDir, 'index.html');
  if (!fs.existsSync(built)) return true;
  const sources = ['src', 'shared', 'public', 'index.html', 'vite.config.ts', 'package-lock.json']
    .map((p) => path.join(projectRoot, p))
    .filter((p) => fs.existsSync(p));
  return Math.max(...sources.map(newestMtimeMs)) > fs.statSync(built).mtimeMs;
}

/** Build the client into dist/ unless it is up to date. */
export async function buildClientIfStale(log: (msg: string) => void = console.log): Promise<void> {
  if (!clientIsStale()) return;
  log('Building the client…');
  await build({ root: projectRoot, logLevel: 'warn' });
}
