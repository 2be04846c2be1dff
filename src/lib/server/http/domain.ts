// Turns a domain module's refusal (a DomainError) into a response, with the status its code has
// in STATUS_OF_CODE: in an action, a missing or forbidden thing is an error page and any other
// refusal a form failure whose message the page shows beside the form; in a load, every refusal
// is an error page.
import { error, fail } from '@sveltejs/kit';
import { DomainError } from '../platform/errors';

export async function domainAction<T>(run: () => Promise<T>, form = 'form') {
	try {
		return await run();
	} catch (e) {
		if (e instanceof DomainError) {
			if (e.status === 404 || e.status === 403) error(e.status, e.message);
			return fail(e.status, { form, message: e.message });
		}
		throw e;
	}
}

export async function orHttp<T>(run: () => Promise<T>): Promise<T> {
	try {
		return await run();
	} catch (e) {
		if (e instanceof DomainError) error(e.status, e.message);
		throw e;
	}
}
