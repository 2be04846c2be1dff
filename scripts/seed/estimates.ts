// Three demo estimates sent and waiting on the homeowner: a new pond lead (Hollis Wrenfield,
// invented), the stream lead Ingrid Thornbury from the demo inquiries, and a yard lead with no water
// feature (Marisol Penhallow, invented): a flagstone path, a dry creek from a downspout into a
// soak-away, and planting beds, dug in clay with the soil kept on site. Each starts from the features
// the inquiry asked for, sized from the (invented) visit notes below and priced from the demo price
// list. Safe to run twice: a lead that already has an estimate is left alone.
import { eq } from 'drizzle-orm';
import { demoCatalog } from './demo-catalog';
import { starterDesign } from '../../src/lib/estimating/prefill';
import { catalogSchema, type Design, type ParsedCatalog } from '../../src/lib/estimating/schema';
import { starterLabel } from '../../src/lib/estimating/starter-features';
import { starterDrainage } from '../../src/lib/estimating/starter-yard';
import {
	activities,
	contacts,
	estimates,
	leads,
	properties,
	users
} from '../../src/lib/server/platform/db/schema';
import { newId } from '../../src/lib/server/platform/crypto';
import { estimateRow, inquiryActivity, priceDesign, type Db } from './shared';

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
export const DEMO_YARD_LEAD = {
	name: 'Marisol Penhallow',
	email: 'marisol.penhallow@example.test',
	phone: '(555) 010-7732',
	street: '8 Quarry Lane',
	town: 'Juniper Flats',
	services: ['patio', 'planting'],
	budget: '5k-15k',
	timeframe: 'this-season',
	message:
		'The downspout floods the side yard. A stone path to the back gate, something to carry the water away, and beds along the path.',
	reference: 'dry-creek-downspout'
};

const POND_NOTES = { spotLengthFt: 18, spotWidthFt: 13, depthAvailableIn: 30, slope: 'gentle' };
const STREAM_NOTES = { spotLengthFt: 30, spotWidthFt: 8, slope: 'moderate', soil: 'clay' };
const YARD_NOTES = {
	soil: 'clay',
	notes:
		'Downspout at the north-east corner drains across the side yard; gate 32 ft from the patio.'
};

/**
 * The yard lead's design: the path to the gate, the beds along it, and a dry creek carrying the
 * north-east downspout's roof water (a 40 × 25 ft roof section, invented) 36 ft to a soak-away. The
 * dug clay is kept on site to shape the creek's banks.
 */
function shapeYard(design: Design, catalog: ParsedCatalog) {
	const features = design.features ?? [];
	const path = features.find((f) => f.kind === 'path');
	if (path?.kind === 'path') path.areas = [{ shape: 'rectangle', lengthFt: 32, widthFt: 4 }];
	const beds = features.find((f) => f.kind === 'planting');
	if (beds?.kind === 'planting') beds.areas = [{ shape: 'rectangle', lengthFt: 24, widthFt: 5 }];
	const creek = starterDrainage(catalog.items);
	creek.name = 'Downspout dry creek';
	creek.catchment.areas = [{ shape: 'rectangle', lengthFt: 40, widthFt: 25 }];
	if (creek.creek) creek.creek.lengthFt = 36;
	creek.houseFallIn = 6;
	design.features = [...features, creek];
	design.site = { ...(design.site ?? {}), haulSpoil: false };
}

type DemoLead = typeof DEMO_POND_LEAD & { reference?: string };

async function demoLead(db: Db, d: DemoLead, salesId: string | null): Promise<string> {
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
		referenceProject: d.reference ?? 'wildlife-pond',
		assigneeId: salesId,
		firstReplyAt: new Date(at.getTime() + 4 * 3_600_000),
		lastTouchAt: new Date(at.getTime() + 4 * 3_600_000),
		consentAt: at,
		createdAt: at,
		updatedAt: at
	});
	await db.insert(activities).values(inquiryActivity(leadId, d, at));
	return leadId;
}

async function sendStarter(
	db: Db,
	leadId: string,
	homeowner: string,
	notes: Record<string, unknown>,
	services: string[],
	salesId: string | null,
	shape?: (design: Design, catalog: ParsedCatalog) => void
) {
	const [already] = await db
		.select({ id: estimates.id })
		.from(estimates)
		.where(eq(estimates.leadId, leadId))
		.limit(1);
	if (already) return;
	const catalog = catalogSchema.parse(demoCatalog());
	const design = starterDesign(
		starterLabel(homeowner, services),
		notes,
		catalog.settings,
		catalog,
		services
	);
	shape?.(design, catalog);
	const quote = priceDesign(
		design,
		catalog,
		`the demo ${services.join('+')} design does not estimate`
	);
	const sentAt = new Date(Date.now() - 2 * 86_400_000);
	await db.transaction(async (tx) => {
		const estimateId = newId();
		await tx.insert(estimates).values(
			estimateRow(
				quote,
				{
					id: estimateId,
					leadId,
					status: 'sent',
					scope: `${design.name}: ${(design.features ?? []).map((f) => f.name).join(', ')}, as walked on the site visit.`,
					sentAt
				},
				salesId
			)
		);
		await tx
			.update(leads)
			.set({ stage: 'estimate_sent', lastTouchAt: sentAt })
			.where(eq(leads.id, leadId));
		await tx.insert(activities).values({
			leadId,
			kind: 'estimate.sent',
			actorId: salesId,
			body: `Estimate v1 sent to ${homeowner}`,
			data: { estimateId, number: 1, totalCents: quote.priced.pricing.totalCents },
			createdAt: sentAt
		});
	});
}

export async function seedSentEstimates(db: Db): Promise<void> {
	const staff = await db.select({ id: users.id, role: users.role }).from(users);
	const salesId = staff.find((u) => u.role === 'sales')?.id ?? null;
	const pond = await demoLead(db, DEMO_POND_LEAD, salesId);
	await sendStarter(db, pond, DEMO_POND_LEAD.name, POND_NOTES, DEMO_POND_LEAD.services, salesId);
	const yard = await demoLead(db, DEMO_YARD_LEAD, salesId);
	await sendStarter(
		db,
		yard,
		DEMO_YARD_LEAD.name,
		YARD_NOTES,
		DEMO_YARD_LEAD.services,
		salesId,
		shapeYard
	);
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
