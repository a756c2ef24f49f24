import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    // Not yet in the default run: the 300-day comparison of the general LP path with HiGHS spends
    // minutes in branch and bound on tight negative-price days, and the fast solver's comparison is
    // unfinished. Run them by hand: npx vitest run test/plan/*.vs-highs.test.ts (see the open issue notes).
    exclude: ['test/plan/solveDay.vs-highs.test.ts', 'test/plan/fastSolver.vs-highs.test.ts', '**/node_modules/**'],
    testTimeout: 120_000,
    hookTimeout: 120_000,
  },
});
