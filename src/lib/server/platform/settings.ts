import { eq } from 'drizzle-orm';
import { z } from 'zod';
import { db } from './db';
import { settings, type Settings } from './db/schema';
import { todayIn } from '$lib/scheduling/zone';

type Reader = Pick<typeof db, 'select'>;

/**
 * The firm's time zone. Pass the caller's transaction when one is open: a second pool connection
 * taken while the transaction holds its own could wait forever when the pool is exhausted.
 */
export async function firmTimeZone(tx: Reader = db): Promise<string> {
	const [row] = await tx
		.select({ timeZone: settings.timeZone })
		.from(settings)
		.where(eq(settings.id, 1))
		.limit(1);
	return row?.timeZone ?? 'America/Denver';
}

/** Today's date (YYYY-MM-DD) on the firm's calendar. */
export async function firmToday(tx: Reader = db, now: Date | number = Date.now()): Promise<string> {
	return todayIn(await firmTimeZone(tx), now);
}

export async function firmSettings(): Promise<Settings> {
	const [row] = await db.select().from(settings).where(eq(settings.id, 1)).limit(1);
	if (!row) {
		throw new Error('The firm settings are missing: run `npm run seed` or `npm run user:create`.');
	}
	return row;
}

function isTimeZone(value: string): boolean {
	try {
		new Intl.DateTimeFormat('en-US', { timeZone: value });
		return true;
	} catch {
		return false;
	}
}

export const settingsSchema = z.object({
	firmName: z.string().trim().min(1, 'Enter the firm name').max(120),
	timeZone: z.string().trim().refine(isTimeZone, 'Use a time zone name such as America/Denver'),
	email: z.string().trim().pipe(z.email('Enter a valid e-mail address')),
	phone: z.string().trim().min(7, 'Enter a phone number').max(40),
	street: z.string().trim().max(200),
	town: z.string().trim().max(120),
	region: z.string().trim().max(60),
	postalCode: z.string().trim().max(20),
	serviceArea: z.string().trim().max(500),
	replyTargetHours: z.coerce
		.number()
		.int('Whole hours')
		.min(1, 'At least 1 hour')
		.max(168, 'At most a week')
});
export type SettingsInput = z.infer<typeof settingsSchema>;

export async function saveSettings(input: SettingsInput): Promise<void> {
	await db
		.insert(settings)
		.values({ id: 1, ...input })
		.onConflictDoUpdate({ target: settings.id, set: input });
}
