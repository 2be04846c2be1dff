/**
 * The demo firm's details and the site's origin. Everything on the public site that names the
 * firm reads it from here, so a real firm changes one file.
 */

const DEFAULT_ORIGIN = 'http://127.0.0.1:3000';

function readOrigin(): string {
	// Read at build time (prerender runs in Node). In a browser bundle `process` is absent.
	const fromEnv = typeof process !== 'undefined' ? process.env?.PUBLIC_ORIGIN : undefined;
	return (fromEnv || DEFAULT_ORIGIN).replace(/\/+$/, '');
}

/** Scheme, host and port of the public site, with no trailing slash. */
export const ORIGIN = readOrigin();

/** An absolute URL on this site for a path such as `/work`. */
export function absolute(path: string): string {
	if (/^https?:\/\//.test(path)) return path;
	return ORIGIN + (path.startsWith('/') ? path : '/' + path);
}

export const firm = {
	name: 'Copperleaf Water & Stone',
	shortName: 'Copperleaf',
	tagline: 'Water features, stonework and light for gardens in frost country',
	description:
		'Copperleaf Water & Stone designs and builds bubbling boulders, pondless streams, small ponds, walls, paths and garden lighting around Linden Ford.',
	town: 'Linden Ford',
	country: 'US',
	timeZone: 'America/Denver',
	phone: '(555) 555-0142',
	phoneHref: 'tel:+15555550142',
	email: 'office@copperleaf.example',
	hours: [
		{ days: 'Monday to Friday', open: '7:30', close: '17:00', schema: 'Mo-Fr 07:30-17:00' },
		{ days: 'Saturday (April to October)', open: '8:00', close: '12:00', schema: 'Sa 08:00-12:00' }
	],
	hoursNote:
		'Mountain Time. Crews are on site most days; the office calls back within one working day.',
	serviceArea: [
		'Linden Ford',
		'Alder Flats',
		'Cinder Bluff',
		'Harrow Creek',
		'Marten Springs',
		'Quarry Hollow',
		'Sable Ridge',
		'Wren Crossing'
	],
	serviceRadius: 'about 35 miles of Linden Ford',
	founded: 2011,
	people: [
		{
			name: 'Mara Quill',
			role: 'Owner and designer',
			bio: 'Mara started the firm after a decade setting stone for other people. She draws every feature before it is priced and still walks each site herself.'
		},
		{
			name: 'Teo Baptiste',
			role: 'Estimator',
			bio: 'Teo is the one who calls you back. He measures the yard, listens for what you actually want, and turns it into an estimate you can read.'
		},
		{
			name: 'Rosa Lindqvist',
			role: 'Crew lead',
			bio: 'Rosa runs the installs: stones, pumps, wiring runs and the last rake of gravel. She also leads the spring start-ups and autumn shut-downs.'
		}
	]
} as const;

export type NavItem = { href: string; label: string };

/** The public navigation, in the order it appears (names from DESIGN.md). */
export const nav: NavItem[] = [
	{ href: '/work', label: 'Our work' },
	{ href: '/services', label: 'Services' },
	{ href: '/guide', label: 'Cost guide' },
	{ href: '/how-we-work', label: 'How we work' },
	{ href: '/about', label: 'About' }
];

/** The inquiry page (issue 4). `ref` carries a portfolio project's slug. */
export function startHref(ref?: string): string {
	return ref ? `/start?ref=${encodeURIComponent(ref)}` : '/start';
}

/** Paths no crawler should visit: the office, the API and every private homeowner link. */
export const privatePaths = [
	'/office',
	'/api',
	'/estimate',
	'/visit',
	'/change-order',
	// The homeowners' care links; the public sign-up at /care itself may be crawled.
	'/care/',
	'/invoice',
	'/pay',
	'/sign-in',
	'/reset',
	'/invite'
];
