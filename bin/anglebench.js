#!/usr/bin/env node
// `anglebench <command>` after a global or project install. The runner is TypeScript run through
// tsx (a runtime dependency), registered in this process so Ctrl-C reaches the run directly; both
// tsx and cli/index.ts are found from this file, not from the working directory.
import { register } from 'tsx/esm/api';

register();
await import('../cli/index.ts');
