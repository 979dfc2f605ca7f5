export * from './auth';
export * from './imports';
export * from './network';
export * from './supply-model';
