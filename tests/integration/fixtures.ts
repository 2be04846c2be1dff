import { db } from '$lib/server/db';
import { settings } from '$lib/server/db/schema';
import { createUser } from '$lib/server/team';
import type { Role } from '$lib/server/db/schema';

export const PASSWORD = 'correct horse battery';

export async function seedFirm(): Promise<void> {
	await db.insert(settings).values({
		id: 1,
		firmName: 'Test Firm',
		email: 'office@test.example',
		phone: '(555) 010-0000'
	});
}

export async function makeUser(role: Role, email = `${role}@test.example`, name = `Test ${role}`) {
	const id = await createUser({ email, name, role, password: PASSWORD });
	return { id, email, name, role };
}
