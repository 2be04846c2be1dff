// Every module that defines queued jobs is imported here, so that the workers know them all.
import './outbox';
import './visits';
import './care';
import './intake';
export { startWorkers, stopQueue } from './queue';
