/** schema.org structured data for the public pages. All URLs are on this site. */
import { absolute, firm } from './site';
import type { Project } from './index';

export type JsonLd = Record<string, unknown>;

const businessId = absolute('/#business');

export function localBusiness(): JsonLd {
	return {
		'@context': 'https://schema.org',
		'@type': 'LandscapingBusiness',
		'@id': businessId,
		name: firm.name,
		description: firm.description,
		url: absolute('/'),
		logo: absolute('/icon-512.png'),
		image: absolute('/og-image.jpg'),
		telephone: firm.phone,
		email: firm.email,
		foundingDate: String(firm.founded),
		address: {
			'@type': 'PostalAddress',
			addressLocality: firm.town,
			addressCountry: firm.country
		},
		areaServed: firm.serviceArea.map((name) => ({ '@type': 'City', name })),
		openingHours: firm.hours.map((h) => h.schema),
		employee: firm.people.map((p) => ({ '@type': 'Person', name: p.name, jobTitle: p.role }))
	};
}

export function creativeWork(p: Project): JsonLd {
	const images = [p.cover, ...p.gallery].map((img) => ({
		'@type': 'ImageObject',
		contentUrl: absolute(img.picture.img.src),
		width: img.picture.img.w,
		height: img.picture.img.h,
		description: img.alt
	}));
	return {
		'@context': 'https://schema.org',
		'@type': 'CreativeWork',
		'@id': absolute(p.path) + '#work',
		name: p.title,
		headline: p.title,
		description: p.summary,
		url: absolute(p.path),
		dateCreated: String(p.year),
		image: images,
		thumbnailUrl: absolute(p.cover.picture.img.src),
		locationCreated: { '@type': 'Place', name: p.town },
		keywords: p.types.join(', '),
		creator: { '@id': businessId, '@type': 'LandscapingBusiness', name: firm.name }
	};
}

export function breadcrumbs(items: { name: string; path: string }[]): JsonLd {
	return {
		'@context': 'https://schema.org',
		'@type': 'BreadcrumbList',
		itemListElement: items.map((it, i) => ({
			'@type': 'ListItem',
			position: i + 1,
			name: it.name,
			item: absolute(it.path)
		}))
	};
}

/** Serialise for a `<script type="application/ld+json">` block, safe against `</script>`. */
export function serialise(data: JsonLd): string {
	return JSON.stringify(data).replace(/</g, '\\u003c');
}
