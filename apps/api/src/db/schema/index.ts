export * from './users';
export * from './clubs';
export * from './cultures';
