// Two demo estimates sent and waiting on the homeowner, for the firm's pond and stream work: a new
// pond lead (Hollis Wrenfield, invented) and the stream lead Ingrid Thornbury from the demo inquiries.
// Each starts from the features the inquiry asked for, sized from the (invented) visit notes below
// and priced from the demo price list. Safe to run twice: a lead that already has an estimate is
// left alone.
import { eq } from 'drizzle-orm';
import { estimate as runEngine } from '../../src/lib/estimating';
import { demoCatalog } from '../../src/lib/estimating/demo';
import { starterDesign } from '../../src/lib/estimating/prefill';
import { catalogSchema } from '../../src/lib/estimating/schema';
import {
	defaultChoices,
	priceWithOverrides,
	totalsForChoices
} from '../../src/lib/estimating/overrides';
import {
	activities,
	contacts,
	estimates,
	leads,
	properties,
	users
} from '../../src/lib/server/platform/db/schema';
import { newId, newToken, sha256 } from '../../src/lib/server/platform/crypto';
import type { scriptDb } from '../lib/db';

type Db = ReturnType<typeof scriptDb>['db'];

export const DEMO_POND_LEAD = {
	name: 'Hollis Wrenfield',
	email: 'hollis.wrenfield@example.test',
	phone: '(555) 010-4418',
	street: '31 Sedge Meadow Road',
	town: 'Stillwater Bend',
	services: ['pond'],
	budget: '15k-30k',
	timeframe: 'this-season',
	message: 'A fish pond we can see from the porch, with room for water lilies.'
};
export const DEMO_STREAM_LEAD_EMAIL = 'ingrid.thornbury@example.test';

const POND_NOTES = { spotLengthFt: 18, spotWidthFt: 13, depthAvailableIn: 30, slope: 'gentle' };
const STREAM_NOTES = { spotLengthFt: 30, spotWidthFt: 8, slope: 'moderate', soil: 'clay' };

async function pondLead(db: Db, salesId: string | null): Promise<string> {
	const d = DEMO_POND_LEAD;
	const [existing] = await db.select().from(contacts).where(eq(contacts.email, d.email)).limit(1);
	if (existing) {
		const [lead] = await db.select().from(leads).where(eq(leads.contactId, existing.id)).limit(1);
		return lead.id;
	}
	const at = new Date(Date.now() - 9 * 86_400_000);
	const contactId = newId();
	await db.insert(contacts).values({
		id: contactId,
		name: d.name,
		email: d.email,
		phone: d.phone,
		phoneDigits: d.phone.replace(/\D/g, ''),
		createdAt: at
	});
	const propertyId = newId();
	await db
		.insert(properties)
		.values({ id: propertyId, contactId, street: d.street, town: d.town, createdAt: at });
	const leadId = newId();
	await db.insert(leads).values({
		id: leadId,
		contactId,
		propertyId,
		stage: 'estimating',
		services: d.services,
		budget: d.budget,
		timeframe: d.timeframe,
		message: d.message,
		source: 'website',
		referenceProject: 'wildlife-pond',
		assigneeId: salesId,
		firstReplyAt: new Date(at.getTime() + 4 * 3_600_000),
		lastTouchAt: new Date(at.getTime() + 4 * 3_600_000),
		consentAt: at,
		createdAt: at,
		updatedAt: at
	});
	await db.insert(activities).values({
		leadId,
		kind: 'inquiry',
		body: d.message,
		data: { services: d.services, budget: d.budget, timeframe: d.timeframe, source: 'website' },
		createdAt: at
	});
	return leadId;
}

async function sendStarter(
	db: Db,
	leadId: string,
	homeowner: string,
	notes: Record<string, unknown>,
	services: string[],
	salesId: string | null
) {
	const [already] = await db
		.select({ id: estimates.id })
		.from(estimates)
		.where(eq(estimates.leadId, leadId))
		.limit(1);
	if (already) return;
	const catalog = catalogSchema.parse(demoCatalog());
	const design = starterDesign(
		`${homeowner} — water feature`,
		notes,
		catalog.settings,
		catalog,
		services
	);
	const engine = runEngine(design, catalog);
	if (!engine.ok) throw new Error(`the demo ${services.join('+')} design does not estimate`);
	const priced = priceWithOverrides(engine, design, catalog, []);
	const totals = totalsForChoices(
		priced.pricing,
		defaultChoices(priced.pricing),
		priced.depositPercent
	);
	const json = <T>(v: T) => JSON.parse(JSON.stringify(v)) as Record<string, unknown>;
	const sentAt = new Date(Date.now() - 2 * 86_400_000);
	await db.transaction(async (tx) => {
		const estimateId = newId();
		await tx.insert(estimates).values({
			id: estimateId,
			leadId,
			number: 1,
			status: 'sent',
			design: json(design),
			result: json({ engine, priced }),
			catalog: json(catalog),
			scope: `${design.name}: ${(design.features ?? []).map((f) => f.name).join(', ')}, as walked on the site visit.`,
			totalCents: priced.pricing.totalCents,
			taxCents: totals.taxCents,
			depositCents: priced.pricing.depositCents,
			createdBy: salesId,
			updatedBy: salesId,
			sentBy: salesId,
			tokenHash: sha256(newToken()),
			sentAt,
			expiresAt: new Date(sentAt.getTime() + 30 * 86_400_000)
		});
		await tx
			.update(leads)
			.set({ stage: 'estimate_sent', lastTouchAt: sentAt })
			.where(eq(leads.id, leadId));
		await tx.insert(activities).values({
			leadId,
			kind: 'estimate.sent',
			actorId: salesId,
			body: `Estimate v1 sent to ${homeowner}`,
			data: { estimateId, number: 1, totalCents: priced.pricing.totalCents },
			createdAt: sentAt
		});
	});
}

export async function seedSentEstimates(db: Db): Promise<void> {
	const staff = await db.select({ id: users.id, role: users.role }).from(users);
	const salesId = staff.find((u) => u.role === 'sales')?.id ?? null;
	const pond = await pondLead(db, salesId);
	await sendStarter(db, pond, DEMO_POND_LEAD.name, POND_NOTES, DEMO_POND_LEAD.services, salesId);
	const [stream] = await db
		.select({ id: leads.id, name: contacts.name, services: leads.services })
		.from(leads)
		.innerJoin(contacts, eq(contacts.id, leads.contactId))
		.where(eq(contacts.email, DEMO_STREAM_LEAD_EMAIL))
		.limit(1);
	if (!stream) return; // the demo inquiries were not written
	await sendStarter(
		db,
		stream.id,
		stream.name,
		STREAM_NOTES,
		stream.services ?? ['stream'],
		salesId
	);
}
