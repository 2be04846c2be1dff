import { absolute, privatePaths } from '$lib/content/site';

// Prerendered to a static robots.txt; a route (not a file in static/) so the Sitemap line can
// carry the absolute URL the robots.txt standard asks for.
export const prerender = true;

export const GET = () =>
	new Response(
		[
			'# Copperleaf Water & Stone: public pages may be crawled; the office, the API and',
			'# private links sent to homeowners may not.',
			'User-agent: *',
			'Allow: /',
			...privatePaths.map((p) => `Disallow: ${p}`),
			'',
			`Sitemap: ${absolute('/sitemap.xml')}`,
			''
		].join('\n'),
		{ headers: { 'content-type': 'text/plain; charset=utf-8' } }
	);
