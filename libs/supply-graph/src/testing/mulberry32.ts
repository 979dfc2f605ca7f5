/** The seeded generator, re-exported for tests and the demo (it lives in ../random.ts). */
export * from '../random';
