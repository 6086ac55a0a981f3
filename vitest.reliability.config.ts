// `npm run test:reliability`: the whole reliability suite, including the one-minute load test that
// is too long for every `npm test` (its file ends in .reliability.ts, outside the default include).
import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/reliability/**/*.test.ts', 'tests/reliability/**/*.reliability.ts'],
    setupFiles: ['tests/setup/fail-on-console-error.ts'],
    globalSetup: ['tests/setup/global-setup.ts'],
    pool: 'forks',
    // One file at a time: the child servers and the load test measure the machine, not each other.
    fileParallelism: false,
    testTimeout: 60_000,
    hookTimeout: 60_000,
  },
});
