import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    // Queue tests start worker processes and a Redis of their own; give them room on 2 cores.
    testTimeout: 60_000,
    hookTimeout: 60_000,
    pool: 'forks',
  },
});
