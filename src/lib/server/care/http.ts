// Maps care's refusals to HTTP: missing → 404, forbidden → 403, the rest → a 400 form failure
// whose message the page shows beside the form.
import { error, fail } from '@sveltejs/kit';
import { CareError } from './db';

export async function careAction<T>(run: () => Promise<T>, form = 'form') {
	try {
		return await run();
	} catch (e) {
		if (e instanceof CareError) {
			if (e.code === 'not_found') error(404, e.message);
			if (e.code === 'forbidden') error(403, e.message);
			return fail(e.code === 'conflict' ? 409 : 400, { form, message: e.message });
		}
		throw e;
	}
}

/** The caller's address for the acceptance record, or null where the adapter cannot tell. */
export function clientAddress(event: { getClientAddress: () => string }): string | null {
	try {
		return event.getClientAddress();
	} catch {
		return null;
	}
}

/** For loads and guards: every refusal becomes an HTTP error page. */
export async function careHttp<T>(run: () => Promise<T>): Promise<T> {
	try {
		return await run();
	} catch (e) {
		if (e instanceof CareError) {
			error(e.code === 'not_found' ? 404 : e.code === 'forbidden' ? 403 : 400, e.message);
		}
		throw e;
	}
}
