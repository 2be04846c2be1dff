import { verifyThanks } from '$lib/server/leads/intake/stamp';
import type { PageServerLoad } from './$types';

// Server-rendered (the number comes from the signed link) and shipped with no JavaScript.
export const prerender = false;
export const csr = false;

export const load: PageServerLoad = ({ url }) => {
	const n = verifyThanks(url.searchParams.get('n'), url.searchParams.get('s'));
	return { reference: n ? `R-${n}` : null };
};
