import { defineConfig } from 'vitest/config';
import { fileURLToPath } from 'node:url';

const here = (p: string) => fileURLToPath(new URL(p, import.meta.url));

// Workspace packages resolve to their TypeScript source, so nothing needs building before tests.
const alias = {
  '@splitscope/contract': here('./packages/contract/src/index.ts'),
  '@splitscope/circuit': here('./packages/circuit/src/index.ts'),
  '@splitscope/diagnosis': here('./packages/diagnosis/src/index.ts'),
  '@splitscope/boards/readings': here('./packages/boards/src/readings/index.ts'),
  '@splitscope/boards/units': here('./packages/boards/src/units.ts'),
  '@splitscope/boards': here('./packages/boards/src/index.ts'),
  // The web app's own root, as its Vite config names it, for web unit tests of modules that import through it.
  '@': here('./apps/web/src'),
};

export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      {
        resolve: { alias },
        test: {
          name: 'unit',
          include: ['packages/*/src/**/*.test.ts', 'packages/*/test/**/*.test.ts', 'tests/unit/**/*.test.ts', 'apps/web/src/**/*.test.ts'],
          environment: 'node',
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'integration',
          include: ['apps/server/test/**/*.test.ts', 'tests/integration/**/*.test.ts'],
          environment: 'node',
          // One database for the whole run: files run one after another so tests never race on shared rows.
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
    ],
  },
});
