export * from './slots';
export * from './zone';
export { vtimezone } from './vtimezone';
