#!/usr/bin/env node
// `npm run bench`: runs every test/bench/*.bench.mjs against the BUILT packages (dist/), building first
// when a dist is missing. Benchmarks print timings and ratios against a baseline measured in the
// same run; nothing here asserts a time (speed is reported, not tested).
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = fileURLToPath(new URL('../..', import.meta.url));
if (!existsSync(join(root, 'packages/sdk/dist/index.js'))) {
  process.stdout.write('packages/sdk/dist is missing: running `npm run build` first\n');
  const r = spawnSync('npm', ['run', '--silent', 'build'], { cwd: root, stdio: 'inherit' });
  if (r.status !== 0) {
    process.stderr.write('build failed; cannot benchmark\n');
    process.exit(1);
  }
}
const filter = process.argv[2];
const files = readdirSync(join(root, 'test', 'bench'))
  .filter((f) => f.endsWith('.bench.mjs') && (!filter || f.includes(filter)))
  .sort();
process.stdout.write(`node ${process.version}, ${process.platform}/${process.arch}, ${new Date().toISOString()}\n`);
for (const f of files) {
  process.stdout.write(`\n## ${f}\n`);
  const mod = await import(pathToFileURL(join(root, 'test', 'bench', f)).href);
  await mod.default();
}
