export * from './users';
export * from './clubs';
