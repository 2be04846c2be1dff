// The public care sign-up through its page actions, against the real database: a new homeowner
// is recorded with the features they listed and signed up as through the private link; each
// refusal comes back beside its field with nothing written; a known e-mail address gets the
// private link by mail instead of a sign-up.
import { afterAll, beforeEach, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/platform/db';
import {
	careSubscriptions,
	contacts,
	outbox,
	properties,
	propertyFeatures
} from '$lib/server/platform/db/schema';
import { planSchema } from '$lib/schema/care';
import { savePlan } from '$lib/server/care/plans';
import { stopQueue } from '$lib/server/platform/queue';
import { actions, load } from '../../src/routes/(site)/care/+page.server';
import { load as careLoad } from '../../src/routes/(homeowner)/care/[token]/+page.server';
import { resetDatabase } from '../support/database';
import { seedFirm } from './fixtures';

let planId: string;

beforeEach(async () => {
	await resetDatabase();
	await seedFirm();
	planId = await savePlan(
		null,
		planSchema.parse({
			name: 'Frost-proof care',
			summary: '',
			terms: 'We come once in each window; cancel any time from your link.',
			payYearly: true,
			payPerVisit: true,
			active: true,
			visits: ['startup', 'shutdown'].map((kind) => ({
				kind,
				minutes: '60',
				checklist: ['Look it over']
			})),
			prices: {
				fountain: { small: '110', medium: '145', large: '190' },
				pond: { small: '150', medium: '200', large: '260' },
				stream: {},
				lighting: {}
			}
		})
	);
});

afterAll(async () => {
	await stopQueue();
});

type Result = { status?: number; data?: Record<string, unknown>; location?: string } & Record<
	string,
	unknown
>;

async function post(fields: Record<string, string>, action: 'signUp' | 'price' = 'signUp') {
	const body = new FormData();
	for (const [k, v] of Object.entries(fields)) body.append(k, v);
	const url = `http://127.0.0.1/care?/${action}`;
	try {
		return (await actions[action]({
			locals: {},
			url: new URL(url),
			request: new Request(url, { method: 'POST', body }),
			getClientAddress: () => '192.0.2.10'
		} as never)) as Result;
	} catch (e) {
		// SvelteKit's redirect() throws; hand it back as a result to assert on.
		if (e && typeof e === 'object' && 'location' in e) return e as Result;
		throw e;
	}
}

const good = {
	name: 'Marit Osei',
	email: 'marit.osei@homeowner.example',
	phone: '',
	street: '12 Heron Way',
	town: 'Linden Ford',
	postalCode: '80302',
	pondCount: '2',
	pondSize: 'medium',
	fountainCount: '1',
	fountainSize: 'small',
	streamCount: '0',
	lightingCount: '0',
	planId: '',
	billing: 'visit',
	accept: 'on',
	typedName: 'Marit Osei'
};

describe('the public care sign-up', () => {
	it('lists the active plans for the page', async () => {
		const data = (await load({} as never)) as { plans: { name: string }[] };
		expect(data.plans.map((p) => p.name)).toEqual(['Frost-proof care']);
	});

	it('records the homeowner and each feature listed, signs up and opens their private page', async () => {
		const result = await post({ ...good, planId });
		expect(result.status).toBe(303);
		const token = /^\/care\/([A-Za-z0-9_-]{20,})\?welcome=1$/.exec(String(result.location))?.[1];
		expect(token).toBeTruthy();

		const [contact] = await db
			.select()
			.from(contacts)
			.where(eq(contacts.email, 'marit.osei@homeowner.example'));
		const [property] = await db
			.select()
			.from(properties)
			.where(eq(properties.contactId, contact.id));
		expect([property.street, property.postalCode]).toEqual(['12 Heron Way', '80302']);
		const features = await db
			.select()
			.from(propertyFeatures)
			.where(eq(propertyFeatures.propertyId, property.id));
		expect(features.map((f) => [f.kind, f.size, f.builtBy]).sort()).toEqual([
			['fountain', 'small', 'others'],
			['pond', 'medium', 'others'],
			['pond', 'medium', 'others']
		]);
		const [s] = await db
			.select()
			.from(careSubscriptions)
			.where(eq(careSubscriptions.propertyId, property.id));
		// Start-up and shut-down: two medium ponds at 200.00 and a small fountain at 110.00, twice.
		expect([s.status, s.billing, s.yearCents, s.typedName]).toEqual([
			'active',
			'visit',
			102000,
			'Marit Osei'
		]);

		const page = (await careLoad({
			params: { token: token! },
			url: new URL(`http://127.0.0.1/care/${token}?welcome=1`)
		} as never)) as { welcome: boolean; care: { current: { plan: { name: string } } } };
		expect(page.welcome).toBe(true);
		expect(page.care.current.plan.name).toBe('Frost-proof care');

		const [welcome] = await db
			.select()
			.from(outbox)
			.where(eq(outbox.dedupeKey, `care-welcome:${s.id}`));
		expect(welcome.to).toBe('marit.osei@homeowner.example');
		expect(welcome.text).toMatch(/Your care plan: .*\/care\/[A-Za-z0-9_-]{20,}/);
	});

	it('puts each refusal beside its field and writes nothing', async () => {
		const result = await post({
			...good,
			email: 'not an address',
			pondCount: '0',
			fountainCount: '0',
			accept: '',
			postalCode: ''
		});
		expect(result.status).toBe(400);
		const errors = result.data!.errors as Record<string, string>;
		expect(Object.keys(errors).sort()).toEqual([
			'accept',
			'email',
			'features',
			'planId',
			'postalCode'
		]);
		expect(errors.features).toBe('Tell us about at least one feature');
		expect((result.data!.values as Record<string, string>).street).toBe('12 Heron Way');
		expect(await db.select().from(contacts)).toHaveLength(0);
	});

	it('refuses a plan that does not look after the features listed, beside the plan', async () => {
		const result = await post({
			...good,
			planId,
			pondCount: '0',
			fountainCount: '0',
			lightingCount: '3'
		});
		expect(result.status).toBe(400);
		expect(result.data!.errors).toEqual({
			planId: 'This plan does not look after the features you listed'
		});
		expect(await db.select().from(contacts)).toHaveLength(0);
	});

	it('sends a known e-mail address its private link instead of signing up', async () => {
		await db.insert(contacts).values({
			id: 'known-contact',
			name: 'Marit Osei-Lund',
			email: 'marit.osei@homeowner.example'
		});
		const result = await post({ ...good, planId });
		expect(result).toEqual({ form: 'signUp', mailed: 'marit.osei@homeowner.example' });
		expect(await db.select().from(careSubscriptions)).toHaveLength(0);
		const mails = await db
			.select()
			.from(outbox)
			.where(eq(outbox.to, 'marit.osei@homeowner.example'));
		expect(mails).toHaveLength(1);
		expect(mails[0].text).toMatch(/You asked about “Frost-proof care” on our website/);
		expect(mails[0].text).toMatch(/\/care\/[A-Za-z0-9_-]{20,}/);
	});

	it('works out the prices without JavaScript by sending the form back', async () => {
		const result = await post({ pondCount: '1', pondSize: 'large' }, 'price');
		expect(result).toEqual({ form: 'price', values: { pondCount: '1', pondSize: 'large' } });
	});
});
