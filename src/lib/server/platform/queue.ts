// Background work through pg-boss in the same PostgreSQL. Delivery is at least once, so every
// handler must be idempotent (see outbox.ts for e-mail).
import PgBoss from 'pg-boss';
import { env } from './env';

let boss: PgBoss | null = null;
let starting: Promise<PgBoss> | null = null;
const handlers = new Map<string, PgBoss.WorkHandler<object>>();

export const RETRY = { retryLimit: 8, retryDelay: 5, retryBackoff: true } as const;

export function queue(): Promise<PgBoss> {
	if (boss) return Promise.resolve(boss);
	starting ??= (async () => {
		const instance = new PgBoss({ connectionString: env.DATABASE_URL, max: 4, schema: 'pgboss' });
		instance.on('error', (error) => console.error('[queue]', error.message));
		await instance.start();
		boss = instance;
		return instance;
	})().catch((error) => {
		starting = null;
		throw error;
	});
	return starting;
}

/** Declares a kind of job and its handler; workers start with startWorkers(). */
export function defineJob<T extends object>(
	name: string,
	handler: (data: T) => Promise<void>
): void {
	handlers.set(name, async (jobs) => {
		for (const job of jobs) await handler(job.data as T);
	});
}

export async function enqueue(
	name: string,
	data: object,
	options: PgBoss.SendOptions = {}
): Promise<void> {
	const q = await queue();
	await q.createQueue(name);
	await q.send(name, data, { ...RETRY, ...options });
}

/** Runs the workers of every defined job in this process (the app, or a test). */
export async function startWorkers(): Promise<void> {
	const q = await queue();
	for (const [name, handler] of handlers) {
		await q.createQueue(name);
		await q.work(name, { pollingIntervalSeconds: 0.5, batchSize: 5 }, handler);
	}
}

export async function stopQueue(): Promise<void> {
	const q = boss;
	boss = null;
	starting = null;
	await q?.stop({ graceful: true, wait: true, timeout: 5000 });
}
