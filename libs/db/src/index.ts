export * from './schema';
export * from './open-database';
