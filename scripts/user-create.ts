// `npm run user:create -- --email you@firm.example --role owner --name "Your Name"`
// Makes a staff account on a real install. The password is asked for (or read from USER_PASSWORD).
import { parseArgs } from 'node:util';
import { createInterface } from 'node:readline';
import { eq } from 'drizzle-orm';
import { email as emailSchema, newPassword, roleSchema } from '../src/lib/schema/auth';
import { hashPassword } from '../src/lib/server/auth/passwords';
import { newId } from '../src/lib/server/platform/crypto';
import { settings, users } from '../src/lib/server/platform/db/schema';
import { databaseUrl } from './lib/config';
import { scriptDb } from './lib/db';

const { values } = parseArgs({
	options: {
		email: { type: 'string' },
		role: { type: 'string', default: 'owner' },
		name: { type: 'string' }
	}
});

function fail(message: string): never {
	console.error(message);
	process.exit(1);
}

function askHidden(question: string): Promise<string> {
	return new Promise((resolve) => {
		const rl = createInterface({ input: process.stdin, output: process.stdout, terminal: true });
		const write = (rl as unknown as { _writeToOutput: (s: string) => void })._writeToOutput;
		(rl as unknown as { _writeToOutput: (s: string) => void })._writeToOutput = (s: string) => {
			if (s.includes(question)) write.call(rl, s);
		};
		rl.question(question, (answer) => {
			rl.close();
			process.stdout.write('\n');
			resolve(answer);
		});
	});
}

const email = emailSchema.safeParse(values.email ?? '');
if (!email.success) fail(`--email: ${email.error.issues[0].message}`);
const role = roleSchema.safeParse(values.role);
if (!role.success) fail('--role must be owner, sales or crew');
const name = (values.name ?? email.data.split('@')[0]).trim();

const password = newPassword.safeParse(
	process.env.USER_PASSWORD ?? (await askHidden('Password: '))
);
if (!password.success) fail(`Password: ${password.error.issues[0].message}`);

const { db, close } = scriptDb(process.env.DATABASE_URL ?? databaseUrl('dev'));
try {
	const [existing] = await db
		.select({ id: users.id })
		.from(users)
		.where(eq(users.email, email.data));
	if (existing) fail(`${email.data} already has an account.`);
	await db
		.insert(settings)
		.values({ id: 1, firmName: 'Our firm', email: email.data, phone: 'not set yet' })
		.onConflictDoNothing();
	await db.insert(users).values({
		id: newId(),
		email: email.data,
		name,
		role: role.data,
		passwordHash: await hashPassword(password.data)
	});
	console.log(
		`Created ${role.data} ${name} <${email.data}>. Set the firm's details under Settings after signing in.`
	);
} finally {
	await close();
}
