// Every module that defines queued jobs is imported here, so that the workers know them all.
import './platform/outbox';
import './visits/reminders';
import './care/reminders';
import './care/renewal';
import './leads/intake/drafts';
export { startWorkers, stopQueue } from './platform/queue';
