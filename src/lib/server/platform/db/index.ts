import { drizzle } from 'drizzle-orm/postgres-js';
import postgres from 'postgres';
import { building } from '$app/environment';
import { env } from '../env';
import * as schema from './schema';

// While building (prerendering) nothing queries the database, so no URL is needed then.
const url = env.DATABASE_URL ?? (building ? 'postgres://unused@127.0.0.1:9/unused' : undefined);
if (!url) throw new Error('DATABASE_URL is not set (see .env.example)');

export const client = postgres(url, {
	max: Number(env.DATABASE_POOL_SIZE ?? 10),
	connect_timeout: 5,
	idle_timeout: 30,
	onnotice: () => {}
});

export const db = drizzle(client, { schema, casing: 'snake_case' });
export type Database = typeof db;
/** A transaction handle, as drizzle passes it to `db.transaction(async (tx) => …)`. */
export type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];
/** Either the client or a transaction: for helpers that work inside or outside one. */
export type Db = Tx | typeof db;
