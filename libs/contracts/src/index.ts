export * from './auth';
export * from './supply-model';
