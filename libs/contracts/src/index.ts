export * from './auth';
export * from './imports';
export * from './network';
export * from './network-picture';
export * from './register';
export * from './runs';
export * from './supply-model';
