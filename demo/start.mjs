#!/usr/bin/env node
// `npm start`: builds the packages, then serves the demo operations console with
// @web/dev-server on http://127.0.0.1:8000 (PORT overrides the port). Ctrl+C stops it.
import { spawnSync } from 'node:child_process';
import { startDevServer } from '@web/dev-server';
import devServerConfig from '../web-dev-server.config.mjs';

const build = spawnSync('npm', ['run', '--silent', 'build'], { stdio: 'inherit' });
if (build.status !== 0) {
  console.error('\nThe build failed (see above); the demo needs the built packages.');
  process.exit(build.status ?? 1);
}

const port = Number(process.env.PORT || 8000);
let server;
try {
  server = await startDevServer({
    config: { ...devServerConfig, port, hostname: '127.0.0.1', open: false, watch: false },
    readCliArgs: false, readFileConfig: false, logStartMessage: false, autoExitProcess: true,
  });
} catch (error) {
  const inUse = error && typeof error === 'object' && 'code' in error && error.code === 'EADDRINUSE';
  console.error(inUse ? `\nPort ${port} is in use: stop the other server or run PORT=8001 npm start.` : String(error));
  process.exit(1);
}
const address = server.server.address();
console.log(`\nTauline demo operations console: http://127.0.0.1:${address.port}/demo/index.html`);
console.log('(press Ctrl+C to stop)');
