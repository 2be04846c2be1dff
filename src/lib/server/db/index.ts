import { drizzle } from 'drizzle-orm/postgres-js';
import postgres from 'postgres';
import { env } from '$env/dynamic/private';
import * as schema from './schema';

if (!env.DATABASE_URL) throw new Error('DATABASE_URL is not set (see .env.example)');

export const client = postgres(env.DATABASE_URL, {
	max: Number(env.DATABASE_POOL_SIZE ?? 10),
	connect_timeout: 5,
	idle_timeout: 30,
	onnotice: () => {}
});

export const db = drizzle(client, { schema, casing: 'snake_case' });
export type Database = typeof db;
