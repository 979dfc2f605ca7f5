import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

const here = (path: string) => fileURLToPath(new URL(path, import.meta.url));

/** Shared aliases: the same `@keelson/*` names as tsconfig.base.json. */
export const keelsonAliases = {
  '@keelson/contracts': here('./libs/contracts/src/index.ts'),
  '@keelson/db': here('./libs/db/src/index.ts'),
  '@keelson/workbook/fields': here('./libs/workbook/src/fields.ts'),
  '@keelson/workbook/testing': here('./libs/workbook/src/testing/index.ts'),
  '@keelson/workbook': here('./libs/workbook/src/index.ts'),
  '@keelson/scoring': here('./libs/scoring/src/index.ts'),
  '@keelson/supply-graph/testing': here('./libs/supply-graph/src/testing/index.ts'),
  '@keelson/supply-graph': here('./libs/supply-graph/src/index.ts'),
};

export default defineConfig({
  resolve: { alias: keelsonAliases },
  test: {
    include: ['libs/**/*.spec.ts', 'apps/api/**/*.spec.ts', 'tools/**/*.spec.ts', 'tests/unit/**/*.spec.ts'],
    environment: 'node',
    testTimeout: 30_000,
    hookTimeout: 60_000,
    pool: 'forks',
  },
});
