import { error } from '@sveltejs/kit';
import { projects, serviceBySlug, services } from '$lib/content';
import { cautionsForService } from '$lib/content/cautions';
import type { EntryGenerator, PageLoad } from './$types';

export const prerender = true;
export const csr = false;

export const entries: EntryGenerator = () => services.map((s) => ({ slug: s.slug }));

export const load: PageLoad = ({ params }) => {
	const service = serviceBySlug(params.slug);
	if (!service) error(404, 'No such service');
	const examples = projects.filter((p) => p.services.includes(service.slug)).slice(0, 3);
	return { service, examples, cautions: cautionsForService(service) };
};
