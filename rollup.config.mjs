// Builds every package to ESM + .d.ts. Configs run in order: the SDK's dist/ exists
// before the CLI and the elements are type-checked against it.

import { readFileSync, rmSync } from 'node:fs';
import { nodeResolve } from '@rollup/plugin-node-resolve';
import typescript from '@rollup/plugin-typescript';

/** Entry points come from the package's `exports` map, so a new subpath needs no change here. */
function entriesFromExports(name) {
  const manifest = JSON.parse(readFileSync(`packages/${name}/package.json`, 'utf8'));
  const entries = {};
  for (const [subpath, target] of Object.entries(manifest.exports ?? {})) {
    if (typeof target !== 'object') continue;
    // The one-file bundles (./bundle) are built from dist/ by scripts/build-bundles.mjs, not here.
    if (target.import.startsWith('./dist/bundle/')) continue;
    const js = target.import.replace(/^\.\/dist\//, '').replace(/\.js$/, '');
    entries[js] = `packages/${name}/src/${js}.ts`;
    void subpath;
  }
  return entries;
}

const EXTERNAL = ['lit', '@lit/reactive-element', 'lit-html', 'lit-element', '@tauline/sdk', /^node:/];

function pkg(name, input) {
  return {
    input,
    output: {
      dir: `packages/${name}/dist`,
      format: 'es',
      sourcemap: true,
      preserveModules: true,
      preserveModulesRoot: `packages/${name}/src`,
    },
    external: (id) => EXTERNAL.some((e) => (e instanceof RegExp ? e.test(id) : id === e || id.startsWith(`${e}/`))),
    plugins: [
      nodeResolve({ preferBuiltins: true }),
      typescript({
        tsconfig: `packages/${name}/tsconfig.json`,
        declarationDir: `packages/${name}/dist`,
        outDir: `packages/${name}/dist`,
      }),
    ],
  };
}

/**
 * The demo console's scripts bundled with the built packages and Lit's production build into
 * demo/dist/, so the demo server (demo/server.mjs) serves a handful of fixed files and no module
 * resolution. Runs last: it imports the packages' dist/.
 */
rmSync('demo/dist', { recursive: true, force: true }); // no stale chunk is ever served
const demo = {
  input: { console: 'demo/console.js', stress: 'demo/stress.js' },
  output: {
    dir: 'demo/dist',
    format: 'es',
    sourcemap: true,
    entryFileNames: '[name].js',
    chunkFileNames: 'shared-[hash].js',
  },
  plugins: [nodeResolve({ browser: true, exportConditions: ['production'] })],
};

export default [
  pkg('sdk', entriesFromExports('sdk')),
  // The simulate worker is an entry of its own: node:worker_threads starts it by file (dist/simulate-worker.js).
  pkg('cli', { main: 'packages/cli/src/main.ts', 'simulate-worker': 'packages/cli/src/simulate-worker.ts' }),
  pkg('elements', entriesFromExports('elements')),
  demo,
];
