// `npm run seed`: writes the demo scenario into the database of `npm start` (which must be running,
// or started with `npm run services`).
import { databaseUrl } from './lib/config';
import { seedDemo } from './seed/index';

await seedDemo(process.env.DATABASE_URL ?? databaseUrl('dev'));
console.log('Demo data written.');
