/**
 * Allowed dependency directions (see DEVELOPERS.md). Run by `npm run deps:check` inside `npm test`.
 * The pure libraries (workbook, supply-graph, contracts) must run in a worker, the command line
 * and the browser alike, so they may not reach Node built-ins, Express, Drizzle, Angular or RxJS.
 */
const PURE_LIBS = '^libs/(workbook|supply-graph|contracts|scoring)/';
module.exports = {
  forbidden: [
    {
      name: 'pure-libs-no-platform',
      severity: 'error',
      comment: 'Pure libraries import nothing from Node, Express, Drizzle, Angular or RxJS.',
      from: { path: PURE_LIBS, pathNot: '\\.spec\\.ts$' },
      to: {
        dependencyTypes: ['core'],
      },
    },
    {
      name: 'pure-libs-no-frameworks',
      severity: 'error',
      from: { path: PURE_LIBS, pathNot: '\\.spec\\.ts$' },
      to: {
        path: 'node_modules/(express|drizzle-orm|better-sqlite3|@angular|rxjs|multer|pino)/',
      },
    },
    {
      name: 'libs-not-to-apps',
      severity: 'error',
      comment: 'Libraries never depend on an application.',
      from: { path: '^libs/' },
      to: { path: '^apps/' },
    },
    {
      name: 'contracts-is-a-leaf',
      severity: 'error',
      comment: 'Contracts hold shared types and zod schemas only.',
      from: { path: '^libs/contracts/' },
      to: { path: '^libs/(db|workbook|supply-graph|scoring)/' },
    },
    {
      name: 'graph-and-workbook-independent',
      severity: 'error',
      comment: 'The engine and the spreadsheet reader meet only through contracts.',
      from: { path: '^libs/(workbook|supply-graph)/', pathNot: '\\.spec\\.ts$' },
      to: { path: '^libs/db/' },
    },
    {
      name: 'no-deep-imports-across-libs',
      severity: 'error',
      comment: 'Use the @keelson/* alias (a lib\'s src/index.ts), never a file inside another lib.',
      from: { path: '^(libs/[^/]+)/' },
      to: {
        path: '^libs/[^/]+/src/',
        pathNot: ['^$1/', '^libs/[^/]+/src/index\\.ts$', '^libs/[^/]+/src/testing/index\\.ts$'],
      },
    },
    {
      name: 'no-deep-imports-into-libs',
      severity: 'error',
      comment: 'Apps, tools and tests reach a lib through its @keelson/* alias only.',
      from: { path: '^(apps|tools|tests)/' },
      to: {
        path: '^libs/[^/]+/src/',
        pathNot: [
          '^libs/[^/]+/src/index\\.ts$',
          '^libs/[^/]+/src/testing/index\\.ts$',
          '^libs/workbook/src/fields\\.ts$',
        ],
      },
    },
    {
      name: 'no-circular',
      severity: 'error',
      from: {},
      to: { circular: true },
    },
  ],
  options: {
    doNotFollow: { path: 'node_modules' },
    exclude: { path: '(^dist/|\\.angular/)' },
    tsConfig: { fileName: 'tsconfig.json' },
    tsPreCompilationDeps: true,
    enhancedResolveOptions: { exportsFields: ['exports'], conditionNames: ['import', 'require', 'node', 'default'] },
  },
};
