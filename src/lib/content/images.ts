/**
 * The portfolio's pictures, through @sveltejs/enhanced-img: each file becomes an AVIF/WebP/JPEG
 * `<picture>` set at these widths, with its intrinsic width and height (no layout shift).
 */
export interface Picture {
	sources: Record<string, string>;
	img: { src: string; w: number; h: number };
}

const modules = import.meta.glob<Picture>('/src/lib/assets/work/*/*.{jpg,jpeg,png,webp,avif}', {
	eager: true,
	import: 'default',
	query: { enhanced: true, w: '480;800;1200;1600' }
});

const prefix = '/src/lib/assets/work/';

/** Pictures keyed by `<project slug>/<file name>`. */
export const pictures: ReadonlyMap<string, Picture> = new Map(
	Object.entries(modules).map(([path, picture]) => [path.slice(prefix.length), picture])
);

export function picture(key: string): Picture {
	const p = pictures.get(key);
	if (!p) throw new Error(`No image src/lib/assets/work/${key}`);
	return p;
}
