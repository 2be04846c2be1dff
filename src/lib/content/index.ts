/**
 * Loads and validates the markdown in `content/` at build time. A malformed file throws a
 * ContentError naming the file and the field, which fails the prerender and so the build.
 */
import type { Component } from 'svelte';
import { pictures, type Picture } from './images';
import {
	parsePage,
	parseProject,
	parseService,
	type ImageRef,
	type PageMeta,
	type ProjectMeta,
	type ServiceMeta
} from './schema';
import { featureTypes, seasons, type FeatureType } from './types';

interface MarkdownModule {
	default: Component;
	metadata?: Record<string, unknown>;
}

const workFiles = import.meta.glob<MarkdownModule>('/content/work/*.md', { eager: true });
const serviceFiles = import.meta.glob<MarkdownModule>('/content/services/*.md', { eager: true });
const pageFiles = import.meta.glob<MarkdownModule>('/content/pages/*.md', { eager: true });

/** `/content/work/a.md` → `content/work/a.md`, the way the owner sees the path. */
const shown = (path: string) => path.replace(/^\//, '');

export interface Service extends ServiceMeta {
	Body: Component;
	path: string;
}

export const services: Service[] = Object.entries(serviceFiles)
	.map(([file, mod]) => ({
		...parseService(shown(file), mod.metadata),
		Body: mod.default,
		path: ''
	}))
	.map((s) => ({ ...s, path: `/services/${s.slug}` }))
	.sort((a, b) => a.order - b.order || a.title.localeCompare(b.title));

const serviceSlugs = new Set(services.map((s) => s.slug));

export interface ProjectImage extends ImageRef {
	picture: Picture;
}

export interface Project extends Omit<ProjectMeta, 'cover' | 'gallery'> {
	Body: Component;
	path: string;
	cover: ProjectImage;
	gallery: ProjectImage[];
	/** "Summer 2024" */
	when: string;
}

const seasonLabel = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

function toProject(file: string, mod: MarkdownModule): Project {
	const meta = parseProject(shown(file), mod.metadata, {
		hasImage: (key) => pictures.has(key),
		services: serviceSlugs
	});
	const withPicture = (img: ImageRef): ProjectImage => ({
		...img,
		picture: pictures.get(`${meta.slug}/${img.file}`)!
	});
	return {
		...meta,
		Body: mod.default,
		path: `/work/${meta.slug}`,
		cover: withPicture(meta.cover),
		gallery: meta.gallery.map(withPicture),
		when: `${seasonLabel(meta.season)} ${meta.year}`
	};
}

const sortKey = (p: Project) => p.year * 10 + seasons.indexOf(p.season);

/** Every project, newest first. */
export const projects: Project[] = Object.entries(workFiles)
	.map(([file, mod]) => toProject(file, mod))
	.sort((a, b) => sortKey(b) - sortKey(a) || a.title.localeCompare(b.title));

export function projectBySlug(slug: string): Project | undefined {
	return projects.find((p) => p.slug === slug);
}

export function projectsOfType(type: FeatureType): Project[] {
	return projects.filter((p) => p.types.includes(type));
}

export function serviceBySlug(slug: string): Service | undefined {
	return services.find((s) => s.slug === slug);
}

/** Feature types that have at least one project, in the vocabulary's order. */
export function usedTypes(): { slug: FeatureType; label: string; blurb: string; count: number }[] {
	return (Object.keys(featureTypes) as FeatureType[])
		.map((slug) => ({ slug, ...featureTypes[slug], count: projectsOfType(slug).length }))
		.filter((t) => t.count > 0);
}

/** Related projects: most shared feature types first, never the project itself. */
export function relatedProjects(project: Project, limit = 3): Project[] {
	return projects
		.filter((p) => p.slug !== project.slug)
		.map((p) => ({ p, shared: p.types.filter((t) => project.types.includes(t)).length }))
		.filter((x) => x.shared > 0)
		.sort((a, b) => b.shared - a.shared)
		.slice(0, limit)
		.map((x) => x.p);
}

export interface Page extends PageMeta {
	Body: Component;
}

export function page(name: string): Page {
	const entry = Object.entries(pageFiles).find(([file]) => file.endsWith(`/${name}.md`));
	if (!entry) throw new Error(`content/pages/${name}.md is missing`);
	const [file, mod] = entry;
	return { ...parsePage(shown(file), mod.metadata), Body: mod.default };
}

/** Every public, prerendered path (the sitemap and the build-output test use this). */
export function publicPaths(): string[] {
	return [
		'/',
		'/work',
		...usedTypes().map((t) => `/work/type/${t.slug}`),
		...projects.map((p) => p.path),
		'/services',
		...services.map((s) => s.path),
		'/guide',
		'/how-we-work',
		'/about'
	];
}
