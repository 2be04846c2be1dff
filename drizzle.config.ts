import { defineConfig } from 'drizzle-kit';
import { databaseUrl } from './scripts/lib/config';

export default defineConfig({
	schema: './src/lib/server/platform/db/schema/index.ts',
	out: './drizzle',
	dialect: 'postgresql',
	dbCredentials: { url: process.env.DATABASE_URL ?? databaseUrl('dev') },
	strict: true,
	verbose: true
});
