import { drizzle } from 'drizzle-orm/postgres-js';
import { migrate } from 'drizzle-orm/postgres-js/migrator';
import postgres from 'postgres';
import { fileURLToPath } from 'node:url';

const migrationsFolder = fileURLToPath(new URL('../../drizzle', import.meta.url));

/** Applies the committed drizzle-kit migrations with Drizzle's migrator. */
export async function runMigrations(databaseUrl: string): Promise<void> {
	const sql = postgres(databaseUrl, { max: 1, onnotice: () => {} });
	try {
		await migrate(drizzle(sql), { migrationsFolder });
	} finally {
		await sql.end();
	}
}
