import type { Handle } from '@sveltejs/kit';
import { building } from '$app/environment';
import { refusal } from './refusal';
import { ENCODED_SEPARATOR, requestPath } from '../http/request-path';

// C0 control characters (NUL, tab, CR, LF, …) and DEL. No query parameter of this app carries
// them legitimately, and a CR/LF in one could end up in a header, a log line or a CSV cell.
// eslint-disable-next-line no-control-regex -- finding control characters is the point
export const CONTROL = /[\u0000-\u001f\u007f]/;

/** Why a query string is refused, or null when every parameter is acceptable. */
export function queryProblem(search: string): string | null {
	if (!search || search === '?') return null;
	for (const pair of search.replace(/^\?/, '').split('&')) {
		for (const part of pair.split('=')) {
			let value: string;
			try {
				value = decodeURIComponent(part.replaceAll('+', ' '));
			} catch {
				return 'A query parameter has a bad percent-escape (a “%” not followed by two hex digits)';
			}
			if (CONTROL.test(value)) {
				return 'A query parameter contains a control character (such as NUL, CR or LF)';
			}
		}
	}
	return null;
}

/** Refuses malformed request lines with a 400 and the reason, before any page code runs. */
export const handleInput: Handle = async ({ event, resolve }) => {
	// Prerendered pages have no query string (and may not read it).
	if (building) return resolve(event);
	const { pathname, search } = event.url;
	if (ENCODED_SEPARATOR.test(pathname)) {
		return refusal(pathname, 400, 'The address contains an encoded “/” or “\\”');
	}
	const path = requestPath(pathname);
	if (path === null) return refusal(pathname, 400, 'The address has a bad percent-escape');
	if (CONTROL.test(path)) return refusal(pathname, 400, 'The address contains a control character');
	const problem = queryProblem(search);
	if (problem) return refusal(pathname, 400, problem);
	return resolve(event);
};
