export * from './limits';
export * from './auth';
export * from './cultures';
export * from './clubs';
export * from './notifications';
export * from './planning';
