import { approvedTestimonials } from '$lib/server/jobs/testimonials';
import type { PageServerLoad } from './$types';

// Server-rendered (the words change when the owner approves one), cached briefly at the edge.
export const prerender = false;
export const csr = false;

export const load: PageServerLoad = async ({ setHeaders }) => {
	setHeaders({ 'cache-control': 'public, max-age=300, stale-while-revalidate=3600' });
	const words = await approvedTestimonials();
	return {
		words: words.map((w) => ({
			id: w.id,
			body: w.body ?? '',
			name: w.displayName ?? '',
			town: w.town ?? ''
		}))
	};
};
