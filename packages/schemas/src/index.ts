export * from './limits';
export * from './auth';
