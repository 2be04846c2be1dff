// `npm run services`: only the local services (for `npm run dev` in another terminal, or tools).
import './lib/tether.js';
import { exitWithError } from './lib/errors';
import { startServices, stopOnSignals } from './lib/services';

const profile = process.argv.includes('--test') ? 'test' : 'dev';
stopOnSignals();
try {
	await startServices(profile, { log: console.log });
	console.log('Services running. Ctrl-C stops them.');
} catch (error) {
	exitWithError(error);
}
