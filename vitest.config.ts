import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    // Queue tests start worker processes and a Redis of their own; give them room on 2 cores.
    testTimeout: 60_000,
    hookTimeout: 60_000,
    pool: 'forks',
    // Two files at once on 2 cores: vitest's run mode takes one worker fewer than the cores, and
    // most files (the solver's, the ngspice ones waiting on their simulator) leave a core idle.
    maxWorkers: 2,
  },
});
