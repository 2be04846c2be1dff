// The demo job: Felix Marchbank's estimate, priced from the demo price list that
// scripts/seed/pricelist.ts writes, accepted by the homeowner through his link, then converted by
// the jobs domain's own convertAcceptedEstimate and scheduled for crew lead Rosa Lindqvist today
// and tomorrow (firm time), so the crew lead's demo sign-in opens on a job. Safe to run twice:
// nothing is written when the demo lead already has an estimate.
import { register } from 'node:module';
import { eq } from 'drizzle-orm';
import { demoCatalog, demoDesign } from './demo-catalog';
import { catalogSchema } from '../../src/lib/estimating/schema';
import {
	activities,
	contacts,
	estimateAcceptances,
	estimates,
	jobDays,
	jobs,
	leads,
	users
} from '../../src/lib/server/platform/db/schema';
import { newId } from '../../src/lib/server/platform/crypto';
import { acceptanceRow, estimateRow, firmDay, firmTimeZone, priceDesign, type Db } from './shared';

export const DEMO_JOB_LEAD_EMAIL = 'felix.marchbank@example.test';
export const DEMO_JOB_TITLE = 'Basalt columns beside the deck';
export const DEMO_JOB_SCOPE =
	'Three basalt columns bubbling over a hidden gravel basin beside the deck, with a pebble topping';

/**
 * The jobs domain lives in the app and reads `building` from SvelteKit's `$app/environment`;
 * outside SvelteKit (a seed script) that module is answered here, as it is at run time.
 */
let hooked = false;
export async function jobsDomain() {
	if (!hooked) {
		hooked = true;
		const environment =
			'export const building = false, browser = false, dev = false, version = "seed";';
		register(
			`data:text/javascript,${encodeURIComponent(`
				export async function resolve(specifier, context, next) {
					if (specifier === '$app/environment') {
						return { url: 'data:text/javascript,${encodeURIComponent(environment)}', shortCircuit: true };
					}
					return next(specifier, context);
				}`)}`
		);
	}
	// The app's database module opens its pool lazily; every query below runs in our transaction.
	process.env.DATABASE_URL ??= 'postgres://unused@127.0.0.1:9/unused';
	const [conversion, labels] = await Promise.all([
		import('../../src/lib/server/jobs/conversion'),
		import('../../src/lib/server/jobs/labels')
	]);
	return { ...conversion, ...labels };
}

export async function seedJobs(db: Db): Promise<void> {
	const [lead] = await db
		.select({ id: leads.id, contactName: contacts.name })
		.from(leads)
		.innerJoin(contacts, eq(contacts.id, leads.contactId))
		.where(eq(contacts.email, DEMO_JOB_LEAD_EMAIL))
		.limit(1);
	if (!lead) return; // the demo leads were not written (S3 or leads seed skipped)
	const [already] = await db
		.select({ id: estimates.id })
		.from(estimates)
		.where(eq(estimates.leadId, lead.id))
		.limit(1);
	if (already) return;
	const staff = await db.select({ id: users.id, role: users.role, email: users.email }).from(users);
	const sales = staff.find((u) => u.role === 'sales');
	const owner = staff.find((u) => u.role === 'owner');
	const rosa = staff.find((u) => u.email === 'rosa@copperleaf.example');
	const timeZone = await firmTimeZone(db);

	// The same catalog the demo price list rows were written from (seedPriceList parses it too).
	const catalog = catalogSchema.parse(demoCatalog());
	// The design's name becomes the job's title.
	const design = { ...demoDesign(), name: DEMO_JOB_TITLE };
	const quote = priceDesign(design, catalog, 'the demo design no longer estimates');
	const { choices, totals } = quote;
	const { convertAcceptedEstimate, jobRef } = await jobsDomain();

	const sentAt = new Date(Date.now() - 6 * 86_400_000);
	const acceptedAt = new Date(Date.now() - 2 * 86_400_000);
	await db.transaction(async (tx) => {
		const estimateId = newId();
		await tx
			.insert(estimates)
			.values(
				estimateRow(
					quote,
					{ id: estimateId, leadId: lead.id, status: 'accepted', scope: DEMO_JOB_SCOPE, sentAt },
					sales?.id ?? null
				)
			);
		await tx.insert(estimateAcceptances).values(
			acceptanceRow(quote, {
				estimateId,
				typedName: lead.contactName,
				acceptedAt,
				ipAddress: '192.0.2.44'
			})
		);
		await tx.insert(activities).values({
			leadId: lead.id,
			kind: 'estimate.accepted',
			body: `${lead.contactName} accepted estimate v1`,
			data: { estimateId, number: 1, totalCents: totals.totalCents, choices },
			createdAt: acceptedAt
		});
		// convertAcceptedEstimate is typed with the app's client; the script's client is the same
		// drizzle-orm postgres-js database over the same schema.
		const { jobId, number } = await convertAcceptedEstimate(
			estimateId,
			tx as unknown as Parameters<typeof convertAcceptedEstimate>[1],
			{ actorId: owner?.id ?? null }
		);
		const days = [firmDay(timeZone, 0), firmDay(timeZone, 1)];
		await tx
			.update(jobs)
			.set({ crewLeadId: rosa?.id ?? null })
			.where(eq(jobs.id, jobId));
		await tx.insert(jobDays).values(days.map((day) => ({ id: newId(), jobId, day })));
		await tx.insert(activities).values({
			leadId: lead.id,
			kind: 'job.scheduled',
			actorId: owner?.id ?? null,
			body: `Job ${jobRef(number)} scheduled for ${days.join(', ')}`,
			data: { jobId, days, crewLeadId: rosa?.id ?? null }
		});
	});
}
