import { CONTROL } from '../hooks/input';

/**
 * The page to open after sign-in: only a path of this site (an office page), never another host,
 * a protocol-relative `//host`, a backslash trick (`/\host`) or anything with control characters.
 */
export function safeNext(next: string | null | undefined): string {
	if (!next || next.length > 2000) return '/office';
	if (CONTROL.test(next) || next.includes('\\')) return '/office';
	let url: URL;
	try {
		url = new URL(next, 'http://same.invalid');
	} catch {
		return '/office';
	}
	if (url.origin !== 'http://same.invalid') return '/office';
	const path = url.pathname + url.search + url.hash;
	if (!/^\/office(\/|\?|#|$)/.test(path) || path.startsWith('//')) return '/office';
	return path;
}
