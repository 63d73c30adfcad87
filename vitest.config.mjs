import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

const sdkSrc = fileURLToPath(new URL('./packages/sdk/src/', import.meta.url));

// Node-only suites: the SDK (unit, property), the CLI (in-process and through the built
// binary) and the cross-package reference checks. Browser suites run under
// @web/test-runner instead. `@tauline/sdk` resolves to its TypeScript sources here, so
// unit tests never depend on a stale build.
export default defineConfig({
  resolve: {
    alias: [
      { find: /^@tauline\/sdk$/, replacement: `${sdkSrc}index.ts` },
      { find: /^@tauline\/sdk\/(constants|errors|units)$/, replacement: `${sdkSrc}$1.ts` },
      { find: /^@tauline\/sdk\/([a-z-]+)$/, replacement: `${sdkSrc}$1/index.ts` },
    ],
  },
  test: {
    include: [
      'packages/sdk/test/**/*.test.ts',
      'packages/cli/test/**/*.test.ts',
      'test/reference/**/*.test.ts',
      'test/cross/**/*.test.ts',
    ],
    environment: 'node',
    testTimeout: 60000,
  },
});
