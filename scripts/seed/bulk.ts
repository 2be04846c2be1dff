// `npm run seed:bulk -- 100000`: adds that many plausible, invented leads (with their contacts
// and properties) to the DEV database (or DATABASE_URL), for measurement. Demo data only: every
// name, street and e-mail is made up here, e-mail domains end in .example.
// Multi-row inserts of 2,000 rows per statement; the search text is filled by the trigger.
import { randomBytes } from 'node:crypto';
import postgres from 'postgres';
import { databaseUrl } from '../lib/config';

const count = Number(process.argv[2] ?? 100_000);
if (!Number.isInteger(count) || count < 1 || count > 2_000_000) {
	console.error('Usage: npm run seed:bulk -- <number of leads, 1 to 2,000,000>');
	process.exit(1);
}
const url = process.env.DATABASE_URL ?? databaseUrl('dev');
const sql = postgres(url, { max: 4, onnotice: () => {} });

const FIRST = [
	'Ada',
	'Bram',
	'Cleo',
	'Dario',
	'Elin',
	'Fenn',
	'Greta',
	'Hollis',
	'Iris',
	'Jory',
	'Kaia',
	'Linus',
	'Maren',
	'Nico',
	'Orla',
	'Pike',
	'Quinn',
	'Rhea',
	'Soren',
	'Tamsin',
	'Ulla',
	'Vero',
	'Wes',
	'Yara',
	'Zeb'
];
const LAST = [
	'Ashgrove',
	'Birchall',
	'Cobbold',
	'Dunmere',
	'Elderby',
	'Fallowes',
	'Gorsedge',
	'Hazelrig',
	'Ironside',
	'Juniperry',
	'Kestrell',
	'Larchmont',
	'Mossley',
	'Nettlefold',
	'Oakhurst',
	'Pebbleton',
	'Quarrie',
	'Rushbrook',
	'Sedgewick',
	'Thistlewood',
	'Underhay',
	'Vetchley',
	'Willowby',
	'Yarrowdale'
];
const TOWNS = [
	'Linden Ford',
	'Alder Crossing',
	'Juniper Flats',
	'Stillwater Bend',
	'Fernhollow',
	'Cinder Gap',
	'Millrace',
	'Aspen Shelf'
];
const STREETS = [
	'Weir Road',
	'Cobble Lane',
	'Heron Way',
	'Slate Court',
	'Brookside Drive',
	'Quarry Hill',
	'Spillway Street',
	'Meadow Run'
];
const SERVICES = [
	'water-feature',
	'pond',
	'stream',
	'patio',
	'lighting',
	'planting',
	'walls',
	'other'
];
const BUDGETS = ['under-5k', '5k-15k', '15k-30k', '30k-plus', 'unsure'];
const TIMEFRAMES = ['soon', 'this-season', 'next-season', 'next-year', 'unsure'];
const SOURCES = [
	'website',
	'website',
	'website',
	'referral',
	'referral',
	'search',
	'yard-sign',
	'social',
	'home-show'
];
const MESSAGES = [
	'We would love a bubbling boulder near the back patio, something we can hear from the kitchen.',
	'Looking for a pondless stream down the slope behind the house; the yard drains toward the fence.',
	'A drilled stone column by the front walk, with a light on it at night.',
	'Small wildlife pond with planting around it, the kids are older now so depth is less of a worry.',
	'We have an old retaining wall that is leaning and would like a spillway built into the new one.',
	'Terrace lighting and a low seat wall around the fire area.',
	'Slate spillway into a pebble basin on the side yard, power is already out there.',
	'Not sure what we want yet, saw your work at a neighbour and want ideas.'
];
const STAGES: [string, number][] = [
	['new', 0.08],
	['contacted', 0.14],
	['visit_booked', 0.08],
	['estimating', 0.06],
	['estimate_sent', 0.1],
	['sold', 0.18],
	['closed', 0.36]
];
const REASONS = ['not_a_fit', 'no_reply', 'budget', 'timing', 'chose_another_firm', 'other'];

// A small seeded generator, so two runs make the same shape of data.
// mulberry32 in 32-bit integer arithmetic: the earlier LCG multiplied past 2^53 in floating
// point and fell into a cycle of 473 values, so the bulk data repeated the same 473 leads.
let seed = 20270401;
const rnd = () => {
	seed = (seed + 0x6d2b79f5) | 0;
	let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
	t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
	return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
};
const pick = <T>(a: readonly T[]) => a[Math.floor(rnd() * a.length)];
const id = () => randomBytes(12).toString('base64url');
const run = randomBytes(3).toString('hex');

function stageFor(ageDays: number): string {
	if (ageDays < 2) return rnd() < 0.7 ? 'new' : 'contacted';
	let r = rnd();
	for (const [stage, p] of STAGES) {
		if ((r -= p) < 0) return stage;
	}
	return 'closed';
}

const staff = await sql<{ id: string }[]>`select id from users where role in ('owner', 'sales')`;
const started = performance.now();
const BATCH = 2000;
const now = Date.now();
for (let done = 0; done < count; done += BATCH) {
	const n = Math.min(BATCH, count - done);
	const contacts = [];
	const properties = [];
	const leads = [];
	for (let i = 0; i < n; i++) {
		const k = done + i;
		const first = pick(FIRST);
		const last = pick(LAST);
		const phone = `(555) 0${10 + Math.floor(rnd() * 90)}-${String(Math.floor(rnd() * 10000)).padStart(4, '0')}`;
		const contactId = id();
		const propertyId = id();
		contacts.push({
			id: contactId,
			name: `${first} ${last}`,
			email: `${first}.${last}.${run}${k}@bulk.example`.toLowerCase(),
			phone,
			phone_digits: phone.replace(/\D/g, '')
		});
		properties.push({
			id: propertyId,
			contact_id: contactId,
			street: `${1 + Math.floor(rnd() * 400)} ${pick(STREETS)}`,
			town: pick(TOWNS),
			postal_code: `80${900 + Math.floor(rnd() * 99)}`
		});
		// Two years of leads, more of them recently.
		const ageDays = Math.pow(rnd(), 1.6) * 730;
		const created = new Date(now - ageDays * 86_400_000);
		const stage = stageFor(ageDays);
		const replied = stage !== 'new' && rnd() < 0.95;
		const firstReply = replied
			? new Date(created.getTime() + (0.3 + rnd() * 40) * 3_600_000)
			: null;
		const services = [...new Set([pick(SERVICES), ...(rnd() < 0.4 ? [pick(SERVICES)] : [])])];
		leads.push({
			id: id(),
			contact_id: contactId,
			property_id: propertyId,
			stage,
			services,
			budget: pick(BUDGETS),
			timeframe: pick(TIMEFRAMES),
			message: pick(MESSAGES),
			source: pick(SOURCES),
			assignee_id: staff.length && rnd() < 0.8 ? pick(staff).id : null,
			priority: rnd() < 0.1 ? 'high' : rnd() < 0.2 ? 'low' : 'normal',
			first_reply_at: firstReply,
			last_touch_at: firstReply ?? created,
			close_reason: stage === 'closed' ? pick(REASONS) : null,
			created_at: created,
			updated_at: created
		});
	}
	await sql.begin(async (tx) => {
		await tx`insert into contacts ${tx(contacts)}`;
		await tx`insert into properties ${tx(properties)}`;
		await tx`insert into leads ${tx(leads)}`;
	});
	if ((done / BATCH) % 10 === 0) {
		process.stdout.write(`\r${(done + n).toLocaleString('en-US')} leads…`);
	}
}
// Vacuum sets the visibility map, so the list's covering indexes answer index-only at once
// (autovacuum would get there later by itself).
await sql`vacuum analyze contacts`;
await sql`vacuum analyze properties`;
await sql`vacuum analyze leads`;
const [{ total }] = await sql<{ total: number }[]>`select count(*)::int as total from leads`;
console.log(
	`\rAdded ${count.toLocaleString('en-US')} leads in ${((performance.now() - started) / 1000).toFixed(1)} s; the database now holds ${total.toLocaleString('en-US')}.`
);
await sql.end();
