import { esbuildPlugin } from '@web/dev-server-esbuild';
import { chromeLauncher } from '@web/test-runner-chrome';
import { demoScreenshotPlugin } from './test/browser/screenshot-plugin.mjs';
import { staticPagePlugin } from './test/browser/static-page-plugin.mjs';

// Flags for a closed network and a root sandbox (see DEVELOPERS.md).
export const CHROMIUM_ARGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-dev-shm-usage',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

export default {
  files: ['packages/elements/test/**/*.test.ts', 'test/browser/**/*.test.ts'],
  nodeResolve: true,
  rootDir: '.',
  // Loopback only. @web/dev-server-core 0.x listens on every interface when told "localhost" or
  // "127.0.0.1"; any other loopback address (all of 127.0.0.0/8 is loopback on Linux) is bound as given.
  hostname: '127.0.0.2',
  concurrency: 1,
  browserStartTimeout: 60000,
  testsFinishTimeout: 300000,
  // esbuild reads this tsconfig raw ("extends" is ignored): the decorator options sit in it.
  plugins: [
    esbuildPlugin({ ts: true, target: 'es2022', tsconfig: 'packages/elements/tsconfig.json' }),
    demoScreenshotPlugin(),
    staticPagePlugin(),
  ],
  browsers: [
    chromeLauncher({
      launchOptions: {
        executablePath: process.env.CHROME_PATH || '/usr/bin/chromium',
        headless: true,
        args: CHROMIUM_ARGS,
      },
    }),
  ],
  filterBrowserLogs: ({ args }) => !String(args[0]).includes('Lit is in dev mode'),
  testFramework: { config: { timeout: 20000 } },
};
