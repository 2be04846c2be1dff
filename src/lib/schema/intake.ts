// The inquiry ("Start a project") form: one schema for the server and the browser.
import { z } from 'zod';
import { email } from './auth';

export const SERVICES = {
	'water-feature': 'Water feature (column, boulder, spillway)',
	pond: 'Pond',
	stream: 'Stream or waterfall',
	patio: 'Patio or paths',
	lighting: 'Lighting',
	planting: 'Planting',
	walls: 'Walls and steps',
	other: 'Something else'
} as const;
export type ServiceKey = keyof typeof SERVICES;

export const BUDGETS = {
	'under-5k': 'Under $5,000',
	'5k-15k': '$5,000 to $15,000',
	'15k-30k': '$15,000 to $30,000',
	'30k-plus': 'Over $30,000',
	unsure: 'Not sure yet'
} as const;

export const TIMEFRAMES = {
	soon: 'As soon as possible',
	'this-season': 'This season',
	'next-season': 'Next season',
	'next-year': 'Next year or later',
	unsure: 'Not sure yet'
} as const;

export const HEARD_FROM = {
	'': 'Choose one (optional)',
	search: 'A web search',
	neighbour: 'A neighbour or friend',
	'saw-work': 'Saw one of your projects',
	social: 'Social media',
	'yard-sign': 'A yard sign or truck',
	other: 'Somewhere else'
} as const;

export const MESSAGE_MAX = 4000;
export const MB = 1024 * 1024;
export const PHOTO_LIMITS = {
	maxFiles: 8,
	maxBytes: 15 * MB,
	maxTotalBytes: 60 * MB,
	/** What the file inputs accept: phones convert HEIC to JPEG when only these are listed. */
	accept: 'image/jpeg,image/png,image/webp'
} as const;

const keys = <T extends object>(o: T) =>
	Object.keys(o) as [keyof T & string, ...(keyof T & string)[]];

const optionalText = (max: number, tooLong: string) =>
	z.string().trim().max(max, tooLong).default('');

export const inquirySchema = z.object({
	name: z
		.string()
		.trim()
		.min(1, 'Tell us your name')
		.max(120, 'Keep the name under 120 characters'),
	email,
	phone: optionalText(40, 'Keep the phone number under 40 characters').refine(
		(v) => v === '' || v.replace(/\D/g, '').length >= 7,
		'Enter a phone number with its area code, or leave it empty'
	),
	street: z
		.string()
		.trim()
		.min(1, 'Enter the street address of the yard')
		.max(200, 'Keep the street under 200 characters'),
	town: z.string().trim().min(1, 'Enter the town').max(120, 'Keep the town under 120 characters'),
	postalCode: optionalText(20, 'Keep the postal code under 20 characters'),
	services: z
		.array(z.enum(keys(SERVICES), { message: 'Pick from the list' }))
		.min(1, 'Pick at least one thing you would like')
		.max(Object.keys(SERVICES).length),
	budget: z.enum(keys(BUDGETS), { message: 'Pick a budget range (or “Not sure yet”)' }),
	timeframe: z.enum(keys(TIMEFRAMES), { message: 'Pick a timeframe (or “Not sure yet”)' }),
	heardFrom: z.enum(keys(HEARD_FROM), { message: 'Pick from the list' }).default(''),
	message: optionalText(
		MESSAGE_MAX,
		`Keep the message under ${MESSAGE_MAX.toLocaleString('en-US')} characters`
	),
	consent: z.literal('yes', { message: 'Tick the box so we may contact you about this project' }),
	ref: z
		.string()
		.trim()
		.max(80)
		.regex(/^[a-z0-9-]*$/, 'Unknown project')
		.default('')
});

export type InquiryInput = z.infer<typeof inquirySchema>;

/** The typed values of the form, as the page refills them (files and tokens excluded). */
export interface InquiryValues {
	name: string;
	email: string;
	phone: string;
	street: string;
	town: string;
	postalCode: string;
	services: string[];
	budget: string;
	timeframe: string;
	heardFrom: string;
	message: string;
	consent: string;
	ref: string;
}

const TEXT_FIELDS = [
	'name',
	'email',
	'phone',
	'street',
	'town',
	'postalCode',
	'budget',
	'timeframe',
	'heardFrom',
	'message',
	'consent',
	'ref'
] as const;

/** Reads the typed values from a form post (a repeated checkbox gives several services). */
export function inquiryValues(data: FormData): InquiryValues {
	const text = (key: string) => {
		const v = data.get(key);
		return typeof v === 'string' ? v.slice(0, MESSAGE_MAX * 3) : '';
	};
	const out = Object.fromEntries(TEXT_FIELDS.map((k) => [k, text(k)])) as Omit<
		InquiryValues,
		'services'
	>;
	const services = data
		.getAll('services')
		.filter((v): v is string => typeof v === 'string')
		.slice(0, 20);
	return { ...out, services };
}

/** Control characters (C0, C1), zero-width marks and bidi overrides. */
function isHidden(c: string): boolean {
	const n = c.codePointAt(0) ?? 0;
	return (
		n < 0x20 ||
		(n >= 0x7f && n <= 0x9f) ||
		(n >= 0x200b && n <= 0x200f) ||
		(n >= 0x202a && n <= 0x202e) ||
		(n >= 0x2066 && n <= 0x2069)
	);
}

/** A sender's file name, made safe to show and store as text: no folders, controls or bidi tricks. */
export function cleanFileName(name: string): string {
	const base = name.split(/[\\/]/).pop() ?? '';
	const visible = [...base].filter((c) => !isHidden(c)).join('');
	const trimmed = visible.replace(/^\.+/, '').trim().normalize('NFC');
	return (trimmed || 'photo').slice(0, 120);
}
