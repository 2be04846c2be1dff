import { drizzle } from 'drizzle-orm/postgres-js';
import postgres from 'postgres';
import * as schema from '../../src/lib/server/platform/db/schema';

/** A short-lived Drizzle client for scripts; call `close()` when done. */
export function scriptDb(url: string) {
	const sql = postgres(url, { max: 2, onnotice: () => {} });
	const db = drizzle(sql, { schema, casing: 'snake_case' });
	return { db, sql, close: () => sql.end() };
}
