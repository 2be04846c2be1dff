/**
 * Front-matter schemas for the markdown in `content/`, and the checks zod alone cannot make
 * (slug matches the file name, images exist, services exist). Every failure names the file
 * and the field, so a malformed file stops the build with a message the owner can act on.
 */
import { z } from 'zod';
import { featureTypeSlugs, seasons } from './types';

const slug = z
	.string()
	.regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'must be lower-case words joined by hyphens');

const imageRef = z.strictObject({
	file: z
		.string()
		.regex(
			/^[a-z0-9][a-z0-9-]*\.(jpg|jpeg|png|webp|avif)$/,
			'must be a file name such as cover.jpg'
		),
	alt: z.string().trim().min(8, 'describe the picture in a few words (8 characters or more)'),
	caption: z.string().trim().min(1).optional()
});

const count = z.number().int().nonnegative();
const positive = z.number().positive();

/** What was built, in the units the trade uses here (gallons, gallons per hour, pounds, feet). */
export const factsSchema = z.strictObject({
	basinGallons: positive.optional(),
	pumpGph: positive.optional(),
	outlets: count.optional(),
	lights: count.optional(),
	stones: z.array(z.string().trim().min(2)).min(1).optional(),
	heaviestStoneLb: positive.optional(),
	wallHeightIn: positive.optional(),
	lengthFt: positive.optional(),
	areaSqFt: positive.optional(),
	maxDepthIn: positive.optional(),
	daysOnSite: positive.optional()
});

const thisYear = new Date().getFullYear();

export const projectSchema = z.strictObject({
	title: z.string().trim().min(3).max(80),
	slug,
	town: z
		.string()
		.trim()
		.min(2)
		.max(40)
		.refine((t) => !/\d/.test(t), 'a town name only, never a street address'),
	season: z.enum(seasons),
	year: z
		.number()
		.int()
		.min(2000)
		.max(thisYear + 1),
	types: z.array(z.enum(featureTypeSlugs)).min(1),
	summary: z.string().trim().min(40).max(200),
	cover: imageRef,
	gallery: z.array(imageRef).default([]),
	facts: factsSchema,
	services: z.array(slug).default([]),
	featured: z.boolean().default(false)
});

export type ProjectMeta = z.infer<typeof projectSchema>;
export type ImageRef = z.infer<typeof imageRef>;
export type Facts = z.infer<typeof factsSchema>;

export const serviceSchema = z.strictObject({
	title: z.string().trim().min(3).max(60),
	slug,
	summary: z.string().trim().min(40).max(200),
	order: z.number().int(),
	types: z.array(z.enum(featureTypeSlugs)).default([])
});
export type ServiceMeta = z.infer<typeof serviceSchema>;

export const pageSchema = z.strictObject({
	title: z.string().trim().min(3).max(70),
	description: z.string().trim().min(40).max(200)
});
export type PageMeta = z.infer<typeof pageSchema>;

/** A content file that does not satisfy its schema. `problems` holds one line per field. */
export class ContentError extends Error {
	constructor(
		readonly file: string,
		readonly problems: { field: string; message: string }[]
	) {
		super(
			`Invalid front matter in ${file}:\n` +
				problems.map((p) => `  ${file}: field "${p.field}": ${p.message}`).join('\n')
		);
		this.name = 'ContentError';
	}
}

function fieldName(path: PropertyKey[]): string {
	return path.length ? path.map(String).join('.') : '(front matter)';
}

function describe(issue: z.core.$ZodIssue): string {
	if (issue.code === 'invalid_type' && /received undefined/.test(issue.message)) {
		return `is required (${issue.message.replace(/^Invalid input: /, '')})`;
	}
	if (issue.code === 'unrecognized_keys') {
		return `unknown field(s) ${issue.keys.map((k) => `"${k}"`).join(', ')}`;
	}
	return issue.message;
}

function parseWith<T extends z.ZodType>(schema: T, file: string, data: unknown): z.output<T> {
	const result = schema.safeParse(data ?? {});
	if (result.success) return result.data;
	throw new ContentError(
		file,
		result.error.issues.flatMap((issue) =>
			issue.code === 'unrecognized_keys'
				? issue.keys.map((k) => ({
						field: fieldName([...issue.path, k]),
						message: 'unknown field (check the spelling against docs/adding-a-project.md)'
					}))
				: [{ field: fieldName(issue.path), message: describe(issue) }]
		)
	);
}

function baseName(file: string): string {
	return (file.split('/').pop() ?? file).replace(/\.md$/, '');
}

export interface ProjectContext {
	/** Does this image exist? Receives e.g. `slate-spillway/cover.jpg`. */
	hasImage: (path: string) => boolean;
	/** The slugs of the services in `content/services`. */
	services: ReadonlySet<string>;
}

/** Validate one project's front matter; `file` is the path shown in messages. */
export function parseProject(file: string, data: unknown, ctx: ProjectContext): ProjectMeta {
	const meta = parseWith(projectSchema, file, data);
	const problems: { field: string; message: string }[] = [];
	if (meta.slug !== baseName(file)) {
		problems.push({
			field: 'slug',
			message: `"${meta.slug}" must match the file name "${baseName(file)}"`
		});
	}
	const images: [string, ImageRef][] = [
		['cover.file', meta.cover],
		...meta.gallery.map((g, i): [string, ImageRef] => [`gallery.${i}.file`, g])
	];
	for (const [field, img] of images) {
		const path = `${meta.slug}/${img.file}`;
		if (!ctx.hasImage(path)) {
			problems.push({
				field,
				message: `image "${img.file}" not found (expected src/lib/assets/work/${path})`
			});
		}
	}
	meta.services.forEach((s, i) => {
		if (!ctx.services.has(s)) {
			problems.push({
				field: `services.${i}`,
				message: `unknown service "${s}" (known: ${[...ctx.services].join(', ')})`
			});
		}
	});
	const seen = new Set<string>();
	meta.types.forEach((t, i) => {
		if (seen.has(t)) problems.push({ field: `types.${i}`, message: `"${t}" is listed twice` });
		seen.add(t);
	});
	if (problems.length) throw new ContentError(file, problems);
	return meta;
}

export function parseService(file: string, data: unknown): ServiceMeta {
	const meta = parseWith(serviceSchema, file, data);
	if (meta.slug !== baseName(file)) {
		throw new ContentError(file, [
			{ field: 'slug', message: `"${meta.slug}" must match the file name "${baseName(file)}"` }
		]);
	}
	return meta;
}

export function parsePage(file: string, data: unknown): PageMeta {
	return parseWith(pageSchema, file, data);
}
