#!/usr/bin/env node
// `npm start`: builds the packages and the demo bundle, then serves the demo operations console on
// http://127.0.0.1:8000/ (PORT overrides the port; PORT=0 picks a free one) with the allow-listed
// static server of demo/server.mjs: loopback only, the demo's own files only. `--no-build` serves
// what is already built. Ctrl+C stops it.
import { spawnSync } from 'node:child_process';
import { startDemoServer } from './server.mjs';

if (!process.argv.includes('--no-build')) {
  const build = spawnSync('npm', ['run', '--silent', 'build'], { stdio: 'inherit' });
  if (build.status !== 0) {
    console.error('\nThe build failed (see above); the demo needs the built packages.');
    process.exit(build.status ?? 1);
  }
}

const port = Number(process.env.PORT ?? 8000);
if (!Number.isInteger(port) || port < 0 || port > 65535) {
  console.error(`PORT must be an integer from 0 to 65535; received ${JSON.stringify(process.env.PORT)}.`);
  process.exit(2);
}
let demo;
try {
  demo = await startDemoServer({ port });
} catch (error) {
  const inUse = error && typeof error === 'object' && 'code' in error && error.code === 'EADDRINUSE';
  console.error(
    inUse
      ? `\nPort ${port} is in use: stop the other server or run PORT=8001 npm start.`
      : `\n${error.message ?? error}`,
  );
  process.exit(1);
}
console.log(`\nTauline demo operations console: ${demo.url}`);
console.log('(served on the loopback interface only; press Ctrl+C to stop)');
for (const signal of ['SIGINT', 'SIGTERM']) {
  process.once(signal, () => {
    demo.close().then(() => process.exit(0));
  });
}
