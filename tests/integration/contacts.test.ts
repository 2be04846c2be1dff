// One person per contact: inquiries join a contact only by e-mail; a shared phone or name makes a
// new contact that the office sees as a possible duplicate and may merge, keeping every record.
import { beforeEach, describe, expect, it } from 'vitest';
import { eq, inArray } from 'drizzle-orm';
import { db } from '$lib/server/platform/db';
import { activities, contacts, leads, outbox, settings } from '$lib/server/platform/db/schema';
import { formStamp } from '$lib/server/leads/intake/stamp';
import { receiveInquiry } from '$lib/server/leads/intake/form';
import {
	mergeContacts,
	MergeError,
	possibleDuplicates,
	samePerson
} from '$lib/server/leads/contact-merge';
import { sendLeadMail } from '$lib/server/leads/mail';
import {
	load as leadPageLoad,
	actions as leadPageActions
} from '../../src/routes/office/leads/[id]/+page.server';
import { resetDatabase } from '../support/database';
import { makeUser } from './fixtures';

const PEOPLE = [
	{ name: 'Juniper Okafor', email: 'juniper@example.test' },
	{ name: 'Hal Brightwater', email: 'hal@example.test' },
	{ name: 'Odile Marsh', email: 'odile@example.test' },
	{ name: 'Pim Vantongeren', email: 'pim@example.test' }
];

function form(fields: Record<string, string>) {
	const data = new FormData();
	const base: Record<string, string> = {
		name: 'x',
		email: 'x@example.test',
		phone: '(555) 010-7788',
		street: '4 Fernbrake Row',
		town: 'Alder Flats',
		postalCode: '80998',
		budget: '5k-15k',
		timeframe: 'this-season',
		message: 'A bubbling stone.',
		consent: 'yes',
		startedAt: formStamp(Date.now() - 20_000),
		...fields
	};
	for (const [k, v] of Object.entries(base)) data.append(k, v);
	data.append('services', 'water-feature');
	return data;
}

async function inquire(fields: Record<string, string>): Promise<string> {
	const result = await receiveInquiry(form(fields), { projectTitle: () => undefined });
	expect(result.ok).toBe(true);
	return result.ok ? result.leadId : '';
}

async function contactOf(leadId: string) {
	const [row] = await db
		.select({ contact: contacts })
		.from(leads)
		.innerJoin(contacts, eq(contacts.id, leads.contactId))
		.where(eq(leads.id, leadId));
	return row.contact;
}

beforeEach(async () => {
	await resetDatabase();
	await db
		.insert(settings)
		.values({ id: 1, firmName: 'Test Firm', email: 'office@test.example', phone: '555' });
});

describe('contacts join only by e-mail', () => {
	it('four inquiries sharing one phone number stay four people, each mailed at the address it gave', async () => {
		await makeUser('owner');
		const ids = [];
		for (const p of PEOPLE) ids.push(await inquire(p));
		const found = await Promise.all(ids.map(contactOf));
		expect(found.map((c) => [c.name, c.email])).toEqual(PEOPLE.map((p) => [p.name, p.email]));
		expect(new Set(found.map((c) => c.id)).size).toBe(4);
		// Each acknowledgement went to its own inquirer.
		for (const [i, id] of ids.entries()) {
			const [ack] = await db
				.select()
				.from(outbox)
				.where(eq(outbox.dedupeKey, `inquiry-ack:${id}`));
			expect(ack.to).toBe(PEOPLE[i].email);
		}
		// The same e-mail again (any case) joins; what it typed stays on its timeline entry.
		const again = await inquire({
			name: 'J. Okafor',
			email: 'JUNIPER@example.test',
			phone: '555 999 1234'
		});
		expect((await contactOf(again)).id).toBe(found[0].id);
		const [entry] = await db.select().from(activities).where(eq(activities.leadId, again));
		expect(entry.data.typed).toMatchObject({ name: 'J. Okafor', phone: '555 999 1234' });
		expect(String((entry.data.typed as { email: string }).email).toLowerCase()).toBe(
			'juniper@example.test'
		);
	});

	it('shows "possible duplicate" on both leads, for the same phone or the same name', async () => {
		const a = await inquire(PEOPLE[0]);
		const b = await inquire({ ...PEOPLE[1], phone: '555.010.7788' });
		const c = await inquire({
			name: 'juniper okafor ',
			email: 'jo@elsewhere.test',
			phone: '555 222 3333'
		});
		const d = await inquire({
			name: 'Nobody Alike',
			email: 'n@example.test',
			phone: '555 444 5555'
		});
		const [ca, cb, cc, cd] = await Promise.all([a, b, c, d].map(contactOf));
		const ofA = await possibleDuplicates(ca.id);
		expect(ofA.map((x) => [x.id, x.reasons])).toEqual([
			[cb.id, ['phone']],
			[cc.id, ['name']]
		]);
		expect((await possibleDuplicates(cb.id)).map((x) => x.id)).toEqual([ca.id]);
		expect((await possibleDuplicates(cc.id)).map((x) => x.id)).toEqual([ca.id]);
		expect(await possibleDuplicates(cd.id)).toEqual([]);
		// The lead page carries them for the card.
		const owner = await makeUser('owner');
		const page = (await leadPageLoad({
			params: { id: b },
			locals: { user: owner },
			url: new URL(`http://app.test/office/leads/${b}`)
		} as never)) as { duplicates: { name: string; leads: { number: number }[] }[] };
		expect(page.duplicates.map((x) => x.name)).toEqual(['Juniper Okafor']);
	});
});

describe('merging two contacts', () => {
	it('keeps every name, e-mail and phone, records it on both timelines, and mail still goes where each inquiry said', async () => {
		const sales = await makeUser('sales');
		const a = await inquire(PEOPLE[0]);
		const b = await inquire({ ...PEOPLE[1], phone: '555.010.7788' });
		const [ca, cb] = await Promise.all([a, b].map(contactOf));

		const result = await leadPageActions.merge({
			params: { id: a },
			locals: { user: sales },
			url: new URL(`http://app.test/office/leads/${a}`),
			request: new Request('http://app.test', {
				method: 'POST',
				body: new URLSearchParams({ contactId: cb.id })
			})
		} as never);
		expect(result).toMatchObject({ form: 'merge', ok: expect.stringMatching(/Merged/) });

		const rows = await db
			.select()
			.from(contacts)
			.where(inArray(contacts.id, [ca.id, cb.id]));
		expect(rows.map((r) => [r.name, r.email, r.phone]).sort()).toEqual(
			[
				[PEOPLE[0].name, PEOPLE[0].email, '(555) 010-7788'],
				[PEOPLE[1].name, PEOPLE[1].email, '555.010.7788']
			].sort()
		);
		expect(rows.find((r) => r.id === cb.id)!.mergedIntoId).toBe(ca.id);
		expect(await possibleDuplicates(ca.id)).toEqual([]);
		expect((await samePerson(ca.id)).map((p) => p.email)).toEqual([PEOPLE[1].email]);
		expect((await samePerson(cb.id)).map((p) => p.email)).toEqual([PEOPLE[0].email]);
		for (const lead of [a, b]) {
			const merged = await db
				.select()
				.from(activities)
				.where(eq(activities.leadId, lead))
				.then((r) => r.filter((x) => x.kind === 'contact.merged'));
			expect(merged).toHaveLength(1);
			expect(merged[0].actorId).toBe(sales.id);
		}

		// Mail for lead b still goes to the address b's inquiry gave.
		await sendLeadMail(sales, b, {
			template: 'first-reply',
			sendKey: 'k1',
			subject: 'About your water feature',
			body: 'Hello'
		});
		const [mail] = await db
			.select()
			.from(outbox)
			.where(eq(outbox.dedupeKey, `lead-mail:${b}:k1`));
		expect(mail.to).toBe(PEOPLE[1].email);

		await expect(mergeContacts(ca.id, cb.id, sales)).rejects.toBeInstanceOf(MergeError);
	});

	it('a third contact merged into a merged one joins the same group, never a chain', async () => {
		const owner = await makeUser('owner');
		const ids = [];
		for (const p of PEOPLE.slice(0, 3)) ids.push(await inquire(p));
		const [c1, c2, c3] = await Promise.all(ids.map(contactOf));
		await mergeContacts(c1.id, c2.id, owner);
		await mergeContacts(c3.id, c2.id, owner);
		const all = await db.select().from(contacts);
		const root = all.find((c) => !c.mergedIntoId)!;
		expect(all.filter((c) => c.mergedIntoId).every((c) => c.mergedIntoId === root.id)).toBe(true);
		expect((await samePerson(c1.id)).length).toBe(2);
	});
});
