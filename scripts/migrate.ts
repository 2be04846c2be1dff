import { runMigrations } from './lib/migrate';
import { databaseUrl } from './lib/config';

const url = process.env.DATABASE_URL ?? databaseUrl('dev');
await runMigrations(url);
console.log('Migrations applied.');
