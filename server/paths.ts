import { fileURLToPath } from 'node:url';
import path from 'node:path';

/** The checkout's root, whatever the working directory the server was started from. */
export const projectRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
export const dataDir = path.join(projectRoot, 'data');
export const clientDistDir = path.join(projectRoot, 'dist');
