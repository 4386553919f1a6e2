#!/usr/bin/env node
// The `forecatch` command: runs cli/main.ts through tsx's loader (no separate build step).
import { register } from 'tsx/esm/api';
import { fileURLToPath } from 'node:url';

register();
const main = fileURLToPath(new URL('../cli/main.ts', import.meta.url));
const { run } = await import(main);
process.exitCode = await run(process.argv.slice(2));
