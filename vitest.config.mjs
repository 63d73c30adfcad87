import { defineConfig } from 'vitest/config';

// Node-only suites: the SDK (unit, property), the CLI (runs the built binary) and the
// cross-package reference checks. Browser suites run under @web/test-runner instead.
export default defineConfig({
  test: {
    include: ['packages/sdk/test/**/*.test.ts', 'packages/cli/test/**/*.test.ts', 'test/reference/**/*.test.ts', 'test/cross/**/*.test.ts'],
    environment: 'node',
    testTimeout: 30000,
  },
});
