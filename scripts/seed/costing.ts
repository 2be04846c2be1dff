// A finished demo job for the costing page (invented): Odile Brackenridge's basalt columns,
// sold, built over two days five weeks ago by crew lead Rosa Lindqvist and a helper, with their
// hours per task (some over the estimate, some under), the materials picked and returned, the
// stone supplier's invoice, a compact loader hired for a day and the deposit received. Safe to
// run twice: nothing is written when the demo homeowner already exists.
import { eq } from 'drizzle-orm';
import { demoCatalog, demoDesign } from './demo-catalog';
import { catalogSchema } from '../../src/lib/estimating/schema';
import {
	contacts,
	estimateAcceptances,
	estimates,
	jobCosts,
	jobDays,
	jobMaterials,
	jobs,
	leads,
	materialUsage,
	payments,
	properties,
	timeEntries,
	users
} from '../../src/lib/server/platform/db/schema';
import { newId } from '../../src/lib/server/platform/crypto';
import { jobsDomain } from './jobs';
import { acceptanceRow, estimateRow, firmDay, firmTimeZone, priceDesign, type Db } from './shared';

export const DEMO_COSTED_JOB = {
	name: 'Odile Brackenridge',
	email: 'odile.brackenridge@example.test',
	phone: '(555) 010-6230',
	street: '14 Larkspur Lane',
	town: 'Linden Ford',
	title: 'Basalt columns by the kitchen garden'
};

/** Actual hours as a share of the estimate, by the rate the task was timed from (invented). */
const PACE: Record<string, number> = {
	'dig-hand': 1.35,
	basin: 1.2,
	fill: 1.1,
	branch: 1.1,
	topping: 1.25,
	trench: 1,
	fixture: 1
};
const STONES = 0.9;

export async function seedCosting(db: Db): Promise<void> {
	const d = DEMO_COSTED_JOB;
	const [existing] = await db.select().from(contacts).where(eq(contacts.email, d.email)).limit(1);
	if (existing) return;
	const staff = await db
		.select({ id: users.id, role: users.role, email: users.email, name: users.name })
		.from(users);
	const owner = staff.find((u) => u.role === 'owner');
	const rosa = staff.find((u) => u.email === 'rosa@copperleaf.example');
	const timeZone = await firmTimeZone(db);
	const catalog = catalogSchema.parse(demoCatalog());
	const design = { ...demoDesign(), name: d.title };
	const quote = priceDesign(design, catalog, 'the demo design no longer estimates');
	const { totals } = quote;
	const { convertAcceptedEstimate } = await jobsDomain();
	const { ensureJobTasks } = await import('../../src/lib/server/costing/tasks');
	const at = new Date(Date.now() - 60 * 86_400_000);
	const days = [firmDay(timeZone, -36), firmDay(timeZone, -35)];

	await db.transaction(async (tx) => {
		const contactId = newId();
		const propertyId = newId();
		const leadId = newId();
		await tx.insert(contacts).values({
			id: contactId,
			name: d.name,
			email: d.email,
			phone: d.phone,
			phoneDigits: d.phone.replace(/\D/g, ''),
			isCustomer: true,
			createdAt: at
		});
		await tx
			.insert(properties)
			.values({ id: propertyId, contactId, street: d.street, town: d.town, createdAt: at });
		await tx.insert(leads).values({
			id: leadId,
			contactId,
			propertyId,
			stage: 'estimate_sent',
			services: ['water-feature'],
			message: 'Columns of stone with water over them, where we can hear it from the kitchen.',
			source: 'website',
			createdAt: at,
			lastTouchAt: at,
			consentAt: at
		});
		const estimateId = newId();
		await tx.insert(estimates).values(
			estimateRow(quote, {
				id: estimateId,
				leadId,
				status: 'accepted',
				scope: 'Three basalt columns over a hidden gravel basin beside the kitchen garden',
				sentAt: at
			})
		);
		await tx.insert(estimateAcceptances).values(
			acceptanceRow(quote, {
				estimateId,
				typedName: d.name,
				acceptedAt: new Date(at.getTime() + 3 * 86_400_000),
				ipAddress: '192.0.2.61'
			})
		);
		const { jobId } = await convertAcceptedEstimate(
			estimateId,
			tx as unknown as Parameters<typeof convertAcceptedEstimate>[1],
			{ actorId: owner?.id ?? null }
		);
		const done = new Date(Date.now() - 35 * 86_400_000);
		await tx
			.update(jobs)
			.set({
				crewLeadId: rosa?.id ?? null,
				crewSize: 2,
				stage: 'complete',
				startedAt: new Date(done.getTime() - 86_400_000),
				completedAt: done
			})
			.where(eq(jobs.id, jobId));
		await tx.insert(jobDays).values(days.map((day) => ({ id: newId(), jobId, day })));
		const [job] = await tx.select().from(jobs).where(eq(jobs.id, jobId));
		const tasks = await ensureJobTasks(job, tx as never);
		// Each task's hours split between the two of them, over the two days.
		const entries = tasks.flatMap((t, i) => {
			const share = t.rateKey?.startsWith('stone-') ? STONES : (PACE[t.rateKey ?? ''] ?? 1);
			const minutes = Math.max(15, Math.round((t.estimatedHours * share * 60) / 15) * 15);
			const half = Math.round(minutes / 30) * 15 || minutes;
			return [
				{ person: rosa?.name ?? 'Rosa Lindqvist', minutes: half },
				{ person: 'Dane Ashgrove', minutes: minutes - half }
			]
				.filter((e) => e.minutes > 0)
				.map((e) => ({
					id: newId(),
					jobId,
					taskId: t.id,
					workDate: days[i % 2],
					clientKey: `demo-${newId()}`,
					recordedBy: rosa?.id ?? null,
					...e
				}));
		});
		await tx.insert(timeEntries).values(entries);
		const materials = await tx.select().from(jobMaterials).where(eq(jobMaterials.jobId, jobId));
		const stone = materials.find((m) => m.category === 'stone');
		const pebble = materials.find((m) => m.sku === 'AGG-PEBBLE-RIVER');
		if (stone) {
			await tx.insert(materialUsage).values({
				materialId: stone.id,
				jobId,
				pickedQuantity: stone.quantity,
				returnedQuantity: 0,
				invoiceCostCents: 61_480,
				invoiceReference: 'QS-3318'
			});
		}
		if (pebble) {
			await tx.insert(materialUsage).values({
				materialId: pebble.id,
				jobId,
				pickedQuantity: pebble.quantity + 0.3,
				returnedQuantity: 0.5
			});
		}
		await tx.insert(jobCosts).values({
			id: newId(),
			jobId,
			kind: 'equipment',
			description: 'Compact loader, one day',
			amountCents: 18_500,
			incurredOn: days[0],
			recordedBy: owner?.id ?? null
		});
		await tx.insert(payments).values({
			id: newId(),
			jobId,
			kind: 'deposit',
			method: 'cheque',
			amountCents: totals.depositCents,
			reference: '2207',
			receivedOn: firmDay(timeZone, -50),
			recordedBy: owner?.id ?? null
		});
	});
}
