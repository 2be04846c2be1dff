import { sql as raw } from 'drizzle-orm';
import { hashPassword } from '../../src/lib/server/auth/passwords';
import { settings, users } from '../../src/lib/server/platform/db/schema';
import { newId } from '../../src/lib/server/platform/crypto';
import { scriptDb } from '../lib/db';
import { DEMO_FIRM, DEMO_STAFF } from './demo-data';
import { appEnv, serviceConfig } from '../lib/config';
import { seedLeads } from './leads';
import { seedPriceList } from './pricelist';
import { seedJobs } from './jobs';
import { seedSentEstimates } from './estimates';
import { seedVisits } from './visits';
import { seedCare } from './care';
import { seedCosting } from './costing';
import { seedSuppliers } from './purchasing';

export async function databaseIsEmpty(url: string): Promise<boolean> {
	const { db, close } = scriptDb(url);
	try {
		const [row] = await db.select({ n: raw<number>`count(*)::int` }).from(users);
		return row.n === 0;
	} finally {
		await close();
	}
}

/** Writes the demo firm and its three staff users; safe to run twice. */
export async function seedDemo(url: string): Promise<void> {
	const { db, close } = scriptDb(url);
	try {
		await db
			.insert(settings)
			.values({ id: 1, ...DEMO_FIRM })
			.onConflictDoUpdate({ target: settings.id, set: DEMO_FIRM });
		for (const member of DEMO_STAFF) {
			await db
				.insert(users)
				.values({
					id: newId(),
					email: member.email,
					name: member.name,
					role: member.role,
					passwordHash: await hashPassword(member.password)
				})
				.onConflictDoNothing();
		}
		await seedPriceList(db);
		await seedCare(db);
	} finally {
		await close();
	}
	// Demo inquiries, with photos in the bucket of the same profile as the database.
	const profile = url.includes(`:${serviceConfig('test').pgPort}/`) ? 'test' : 'dev';
	const services = appEnv(profile);
	await seedLeads(url, { s3: { endpoint: services.S3_ENDPOINT, bucket: services.S3_BUCKET } });
	// Demo availability and two booked visits on the intake seed's "visit booked" leads.
	const visitsDb = scriptDb(url);
	try {
		await seedVisits(visitsDb.db);
	} finally {
		await visitsDb.close();
	}
	// The demo job: a lead's accepted estimate converted and scheduled for the crew lead.
	const jobsDb = scriptDb(url);
	try {
		await seedJobs(jobsDb.db);
		// A pond lead, a stream lead and a yard lead (path, dry creek, planting) with estimates sent.
		await seedSentEstimates(jobsDb.db);
		// A finished job with the crew's hours, for the costing page.
		await seedCosting(jobsDb.db);
		await seedSuppliers(jobsDb.db);
	} finally {
		await jobsDb.close();
	}
}
