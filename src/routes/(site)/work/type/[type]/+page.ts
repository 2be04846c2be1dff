import { error } from '@sveltejs/kit';
import { projectsOfType, usedTypes } from '$lib/content';
import { featureTypes, type FeatureType } from '$lib/content/types';
import type { EntryGenerator, PageLoad } from './$types';

export const prerender = true;
export const csr = false;

export const entries: EntryGenerator = () => usedTypes().map((t) => ({ type: t.slug }));

export const load: PageLoad = ({ params }) => {
	const slug = params.type as FeatureType;
	const projects = Object.hasOwn(featureTypes, slug) ? projectsOfType(slug) : [];
	if (!projects.length) error(404, 'No such kind of project');
	return { type: { slug, ...featureTypes[slug] }, projects };
};
