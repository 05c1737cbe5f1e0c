import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: [
      'shared-core/test/**/*.test.ts',
      'files/test/**/*.test.ts',
      'cli/test/**/*.test.ts',
      'server/test/**/*.test.ts',
      'test/**/*.test.ts',
    ],
    testTimeout: 60_000,
    hookTimeout: 120_000,
  },
});
