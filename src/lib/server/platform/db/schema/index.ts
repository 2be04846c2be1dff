// The whole schema, one file per domain; drizzle-kit reads this file (drizzle.config.ts), and the
// app imports tables from here.
export * from './auth';
export * from './platform';
export * from './leads';
export * from './visits';
export * from './estimates';
export * from './jobs';
export * from './photos';
export * from './outbox';
export * from './care-reminders';
export * from './payments';
export * from './care';
export * from './costing';
export * from './purchasing';
export * from './callbacks';
