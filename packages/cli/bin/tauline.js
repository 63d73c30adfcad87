#!/usr/bin/env node
// Launcher kept in git so that npm can link the bin before the first build.
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const entry = new URL('../dist/main.js', import.meta.url);
if (!existsSync(fileURLToPath(entry))) {
  process.stderr.write('tauline: the CLI is not built yet; run `npm run build` at the repository root first.\n');
  process.exit(2);
}
const { main } = await import(entry.href);
process.exitCode = await main(process.argv.slice(2));
