import { defineConfig } from 'vitest/config';

// `npm run fuzz`: the fuzz suite with 10,000 cases.
export default defineConfig({
  test: {
    include: ['test/fuzz-*.test.ts'],
    testTimeout: 3_600_000,
    env: { PLUMBLINE_FUZZ_RUNS: '10000' },
  },
});
