// Fixtures for the estimate tests: a priced catalog and a lead made by direct inserts.
import { db } from '$lib/server/platform/db';
import { contacts, leads } from '$lib/server/platform/db/schema';
import { newId } from '$lib/server/platform/crypto';
import { scriptDb } from '../../scripts/lib/db';
import { seedPriceList } from '../../scripts/seed/pricelist';

export async function seedCatalog(): Promise<void> {
	const { db: sdb, close } = scriptDb(process.env.DATABASE_URL!);
	try {
		await seedPriceList(sdb);
	} finally {
		await close();
	}
}

export async function makeLead(assigneeId?: string, email = 'homeowner@test.example') {
	const contactId = newId();
	await db.insert(contacts).values({ id: contactId, name: 'Ada Fernhill', email });
	const id = newId();
	const [row] = await db
		.insert(leads)
		.values({
			id,
			contactId,
			stage: 'visit_booked',
			message: 'Bubbling columns by the patio',
			assigneeId
		})
		.returning();
	return row;
}
