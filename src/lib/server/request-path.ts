// The path the router will match, for the route-to-role table: the router decodes percent-escapes
// before matching (`/office/%74eam` opens the team page), so the guard must decide on the decoded,
// normalised path too, never on the raw one.

/**
 * Decodes percent-escapes, joins repeated slashes and resolves `.` and `..` segments.
 * Returns null when an escape is malformed (such a path matches no route).
 */
export function requestPath(rawPathname: string): string | null {
	let decoded: string;
	try {
		decoded = decodeURIComponent(rawPathname);
	} catch {
		return null;
	}
	const out: string[] = [];
	for (const segment of decoded.replaceAll('\\', '/').split('/')) {
		if (segment === '' || segment === '.') continue;
		if (segment === '..') out.pop();
		else out.push(segment);
	}
	const trailing = decoded.endsWith('/') && out.length > 0 ? '/' : '';
	return '/' + out.join('/') + trailing;
}
