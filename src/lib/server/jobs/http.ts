// Maps the jobs domain's refusals to HTTP: missing → 404, another crew's job → 403, the rest
// → a 400 form failure with the reason, so the page shows it beside the form.
import { error, fail } from '@sveltejs/kit';
import { JobError } from './errors';

export async function jobAction<T>(run: () => Promise<T>, form = 'form') {
	try {
		return await run();
	} catch (e) {
		if (e instanceof JobError) {
			if (e.code === 'not_found') error(404, e.message);
			if (e.code === 'forbidden') error(403, e.message);
			return fail(400, { form, message: e.message });
		}
		throw e;
	}
}

export async function orHttp<T>(run: () => Promise<T>): Promise<T> {
	try {
		return await run();
	} catch (e) {
		if (e instanceof JobError) {
			error(e.code === 'forbidden' ? 403 : e.code === 'not_found' ? 404 : 400, e.message);
		}
		throw e;
	}
}
