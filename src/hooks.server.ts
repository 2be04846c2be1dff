import { building } from '$app/environment';
import { sequence } from '@sveltejs/kit/hooks';
import type { ServerInit } from '@sveltejs/kit';
import { startWorkers } from '$lib/server/queue-workers';
import { handleBody } from '$lib/server/hooks/body';
import { handleGuard } from '$lib/server/hooks/guard';
import { handleHeaders } from '$lib/server/hooks/headers';
import { handleInput } from '$lib/server/hooks/input';
import { handleOutage, handleServerError } from '$lib/server/hooks/outage';
import { handleSession } from '$lib/server/hooks/session';
import { MissingSecretError, missingSecrets } from '$lib/server/platform/env';

export const handle = sequence(
	handleHeaders,
	handleInput,
	handleOutage,
	handleSession,
	handleGuard,
	handleBody
);
export const handleError = handleServerError;

/** Starts the queue workers in each app process; the app keeps serving if the queue cannot start yet. */
export const init: ServerInit = async () => {
	if (building) return;
	// Refuse to start rather than run on a guessable secret; `npm start`/`npm test` pass local ones.
	const [missing] = missingSecrets();
	if (missing) throw new MissingSecretError(missing);
	if (process.env.RILLSTONE_WORKERS === 'off') return;
	const tryStart = () =>
		startWorkers().catch((error) => {
			console.error('[queue] workers not started, retrying in 10 s:', (error as Error).message);
			setTimeout(tryStart, 10_000);
		});
	void tryStart();
};
