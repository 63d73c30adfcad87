#!/usr/bin/env node
import { readFileSync } from 'node:fs';
import { gzipSync } from 'node:zlib';
// Builds the self-contained, minified ES modules for pages without a bundler (run by `npm run build`
// after rollup, from the per-module dist/ it wrote):
//   packages/elements/dist/bundle/tauline-elements.js  all four elements, Lit inlined, registers the tags
//   packages/sdk/dist/bundle/tauline-sdk.js            the whole SDK in one file
// each with a source map (chained through the dist/ maps to the TypeScript sources). Lit's
// production build is used (the `production` export condition). esbuild is pinned in package.json.
import { build } from 'esbuild';

export const BUNDLES = [
  { entry: 'packages/elements/dist/index.js', out: 'packages/elements/dist/bundle/tauline-elements.js' },
  { entry: 'packages/sdk/dist/index.js', out: 'packages/sdk/dist/bundle/tauline-sdk.js' },
];

for (const { entry, out } of BUNDLES) {
  await build({
    entryPoints: [entry],
    outfile: out,
    bundle: true,
    format: 'esm',
    platform: 'browser',
    target: 'es2022',
    minify: true,
    sourcemap: true,
    conditions: ['production'],
    legalComments: 'eof',
    logLevel: 'warning',
  });
}

if (process.argv.includes('--sizes')) {
  for (const { out } of BUNDLES) {
    const bytes = readFileSync(out);
    console.log(
      `${out}: ${(bytes.length / 1024).toFixed(1)} KiB, gzip ${(gzipSync(bytes, { level: 9 }).length / 1024).toFixed(1)} KiB`,
    );
  }
}
