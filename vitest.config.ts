import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    // Forks, not threads: terminal and child-process tests are safer in their own process.
    pool: 'forks',
    testTimeout: 30_000,
    hookTimeout: 30_000,
  },
});
