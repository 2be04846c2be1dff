export * from './slots';
export * from './zone';
export { vtimezone } from './vtimezone';
export * from './reminders';
