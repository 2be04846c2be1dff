import postgres from 'postgres';

/** Empties every application table, so each test starts from a known state. */
export async function resetDatabase(url = process.env.DATABASE_URL!): Promise<void> {
	const sql = postgres(url, { max: 1, onnotice: () => {} });
	try {
		const tables = await sql<{ tablename: string }[]>`
			select tablename from pg_tables where schemaname = 'public'`;
		if (tables.length) {
			await sql.unsafe(
				`truncate ${tables.map((t) => `"${t.tablename}"`).join(', ')} restart identity cascade`
			);
		}
	} finally {
		await sql.end();
	}
}
