import { defineConfig } from 'vitest/config';
import { keelsonAliases } from '../../vitest.config';

/** Browser journeys: Debian's chromium driven by playwright-core against a real server. */
export default defineConfig({
  resolve: { alias: keelsonAliases },
  test: {
    include: ['tests/e2e/**/*.e2e.ts'],
    environment: 'node',
    testTimeout: 120_000,
    hookTimeout: 180_000,
    pool: 'forks',
    fileParallelism: false,
  },
});
