import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: [
      'test/**/*.test.ts',
      'test/**/*.test.tsx',
      'core/**/*.test.ts',
      'app/**/*.test.ts',
      'renderer/**/*.test.tsx',
    ],
    testTimeout: 60_000,
    hookTimeout: 120_000,
    pool: 'forks',
  },
});
