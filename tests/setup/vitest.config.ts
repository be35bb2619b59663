import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

const root = fileURLToPath(new URL('../..', import.meta.url));

export default defineConfig({
  test: {
    root,
    projects: [
      {
        test: {
          name: 'unit',
          root,
          include: ['tests/unit/**/*.test.ts', 'tests/unit/**/*.test.tsx'],
          environment: 'node',
        },
      },
      {
        test: {
          name: 'integration',
          root,
          include: ['tests/integration/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/setup/global-build.ts'],
          testTimeout: 30_000,
          hookTimeout: 90_000,
          pool: 'forks',
        },
      },
    ],
  },
});
