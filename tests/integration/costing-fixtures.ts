// A job built row by row with figures chosen to be worked by hand (see costing.test.ts): an
// estimate whose catalog holds one labor rate and whose engine result holds three labor tasks,
// and a job whose frozen acceptance holds three priced material lines and the tax.
import { db } from '$lib/server/platform/db';
import {
	estimates,
	jobMaterials,
	jobs,
	users,
	type FrozenEstimate
} from '$lib/server/platform/db/schema';
import { newId } from '$lib/server/platform/crypto';
import { eq } from 'drizzle-orm';
import { makeVisitLead } from './fixtures';

export interface HandJobOptions {
	contractCents?: number;
	taxCents?: number;
	costPerHourCents?: number;
	tasks?: { task: string; hours: number; key?: string; bucket?: string }[];
	lines?: {
		sku: string;
		name: string;
		description: string;
		unit: string;
		quantity: number;
		costCents: number;
	}[];
	crewLeadId?: string | null;
	completedAt?: Date | null;
}

export const HAND_TASKS = [
	{ task: 'Dig and set basin', hours: 6, key: 'basin' },
	{ task: 'Plumb outlets', hours: 4.5, key: 'branch' },
	{ task: 'Set Low basalt column (cart)', hours: 3, key: 'stone-cart' },
	// Bought as an option the homeowner left out: never a labor line of the job.
	{ task: 'Build Low retaining wall', hours: 5, key: 'wall-face', bucket: 'low-wall' }
];

export const HAND_LINES = [
	{
		sku: 'STONE-BASALT-COL',
		name: 'Basalt column',
		description: 'Low column',
		unit: 'ton',
		quantity: 0.8,
		costCents: 48_000
	},
	{
		sku: 'AGG-PEBBLE-RIVER',
		name: 'River pebble',
		description: 'Topping',
		unit: 'ton',
		quantity: 2,
		costCents: 9_000
	},
	{
		sku: 'pump:pump-s2600',
		name: 'Submersible pump S-2600',
		description: 'Pump',
		unit: 'each',
		quantity: 1,
		costCents: 29_000
	}
];

export async function makeHandJob(o: HandJobOptions = {}) {
	const lead = await makeVisitLead();
	const contractCents = o.contractCents ?? 300_000;
	const taxCents = o.taxCents ?? 15_000;
	const tasks = o.tasks ?? HAND_TASKS;
	const lines = o.lines ?? HAND_LINES;
	const estimateId = newId();
	await db.insert(estimates).values({
		id: estimateId,
		leadId: lead.id,
		number: 1,
		status: 'accepted',
		design: {},
		scope: 'A hand-worked job',
		totalCents: contractCents,
		depositCents: 90_000,
		catalog: {
			laborRates: [
				{ id: 'helper', name: 'Helper', costPerHourCents: 2_000, pricePerHourCents: 5_000 },
				{
					id: 'installer',
					name: 'Installer',
					costPerHourCents: o.costPerHourCents ?? 3_850,
					pricePerHourCents: 8_500
				}
			],
			settings: { labor: { rateId: 'installer' } }
		},
		result: {
			engine: { labor: { tasks: tasks.map((t) => ({ bucket: t.bucket ?? 'base', ...t })) } }
		}
	});
	const frozen: FrozenEstimate = {
		estimateId,
		number: 1,
		revision: 1,
		scope: 'A hand-worked job',
		design: {},
		result: {
			totals: { totalCents: contractCents, taxCents },
			lines: lines.map((l) => ({ bucket: 'base', ...l }))
		},
		choices: { options: [], alternates: {} },
		acceptance: {
			typedName: 'Test Homeowner',
			acceptedAt: new Date().toISOString(),
			ipAddress: null,
			userAgent: null,
			method: 'link',
			recordedBy: null
		},
		totalCents: contractCents,
		depositCents: 90_000
	};
	const id = newId();
	const [job] = await db
		.insert(jobs)
		.values({
			id,
			estimateId,
			leadId: lead.id,
			contactId: lead.contactId,
			propertyId: lead.propertyId,
			title: 'Hand-worked job',
			frozen,
			contractCents,
			depositDueCents: 90_000,
			crewLeadId: o.crewLeadId ?? null,
			stage: o.completedAt ? 'complete' : 'underway',
			completedAt: o.completedAt ?? null
		})
		.returning();
	await db.insert(jobMaterials).values(
		lines.map((l, i) => ({
			id: newId(),
			jobId: id,
			category: 'other',
			sku: l.sku,
			name: l.name,
			description: l.description,
			unit: l.unit,
			quantity: l.quantity,
			sortOrder: i
		}))
	);
	const materials = await db.select().from(jobMaterials).where(eq(jobMaterials.jobId, id));
	return { job, lead, materials };
}

export async function userRow(id: string) {
	const [u] = await db.select().from(users).where(eq(users.id, id));
	return u;
}
