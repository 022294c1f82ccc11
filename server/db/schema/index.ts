export * from './users.ts';
export * from './organizations.ts';
export * from './sessions.ts';
export * from './api-keys.ts';
export * from './usage.ts';
export * from './audit.ts';
export * from './metering.ts';
