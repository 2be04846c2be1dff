import { error } from '@sveltejs/kit';
import { projectBySlug, projects, relatedProjects, serviceBySlug } from '$lib/content';
import { cautionsFor } from '$lib/content/cautions';
import type { EntryGenerator, PageLoad } from './$types';

export const prerender = true;
export const csr = false;

export const entries: EntryGenerator = () => projects.map((p) => ({ slug: p.slug }));

export const load: PageLoad = ({ params }) => {
	const project = projectBySlug(params.slug);
	if (!project) error(404, 'No such project');
	return {
		project,
		services: project.services.map((s) => serviceBySlug(s)!),
		related: relatedProjects(project),
		cautions: cautionsFor(project)
	};
};
