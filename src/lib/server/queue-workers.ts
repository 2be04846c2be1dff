// Every module that defines queued jobs is imported here, so that the workers know them all.
import './platform/outbox';
import './visits/visits';
import './care/reminders';
import './leads/intake';
export { startWorkers, stopQueue } from './platform/queue';
