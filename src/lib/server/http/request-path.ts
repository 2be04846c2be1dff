// The path the router will match, for the route-to-role table. SvelteKit decodes the pathname
// with decodeURI before matching (`/office/%74eam` opens the team page) and keeps `%25`, `%2F`
// and the other reserved escapes as they are, so an encoded `/` never splits a segment there.
// The guard decodes the same way. An encoded `/` or `\` has no use in this app's addresses and
// would only invite a guard and a router that disagree about segments, so it is refused.

/** Percent-escapes of `/` and `\`, in either case. */
export const ENCODED_SEPARATOR = /%(2f|5c)/i;

/**
 * Decodes percent-escapes as the router does, joins repeated slashes and resolves `.` and `..`
 * segments. Returns null when an escape is malformed or encodes `/` or `\` (refused with 400).
 */
export function requestPath(rawPathname: string): string | null {
	if (ENCODED_SEPARATOR.test(rawPathname)) return null;
	let decoded: string;
	try {
		decoded = rawPathname.split('%25').map(decodeURI).join('%25');
	} catch {
		return null;
	}
	const out: string[] = [];
	for (const segment of decoded.split('/')) {
		if (segment === '' || segment === '.') continue;
		if (segment === '..') out.pop();
		else out.push(segment);
	}
	const trailing = decoded.endsWith('/') && out.length > 0 ? '/' : '';
	return '/' + out.join('/') + trailing;
}
