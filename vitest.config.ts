import { defineConfig } from 'vitest/config';
import { fileURLToPath } from 'node:url';

const here = (p: string) => fileURLToPath(new URL(p, import.meta.url));

export default defineConfig({
  resolve: {
    alias: [
      { find: /^@multiplet\/physics$/, replacement: here('./packages/physics/src/index.ts') },
      { find: /^@multiplet\/physics\/(.*)$/, replacement: here('./packages/physics/src/$1') },
      { find: /^@multiplet\/cells$/, replacement: here('./packages/cells/src/index.ts') },
      { find: /^@multiplet\/cells\/(.*)$/, replacement: here('./packages/cells/src/$1') },
      { find: /^@multiplet\/cli\/(.*)$/, replacement: here('./packages/cli/src/$1') },
      { find: /^@multiplet\/kernel-bridge$/, replacement: here('./kernel-bridge/src/index.ts') },
      { find: /^@multiplet\/kernel-bridge\/(.*)$/, replacement: here('./kernel-bridge/src/$1') },
    ],
  },
  test: {
    include: ['test/**/*.test.ts'],
    // Browser (Playwright) and Python-driven tests run from their own scripts (see scripts/test.sh).
    exclude: ['test/lab/**', 'test/e2e/**', '**/node_modules/**'],
    testTimeout: 120_000,
    hookTimeout: 120_000,
    pool: 'forks',
  },
});
