export * from './users';
export * from './clubs';
export * from './cultures';
export * from './notifications';
export * from './planning';
export * from './clubs-bank';
export * from './rateLimits';
