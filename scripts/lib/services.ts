// Starts PostgreSQL and the S3 and SMTP stand-ins for a profile, on 127.0.0.1 only.
import { mkdirSync, rmSync } from 'node:fs';
import { appEnv, serviceConfig, databaseUrl, type Profile } from './config';
import { startPayStandIn } from './pay-standin';
import {
	ensureDatabase,
	initCluster,
	pgDataDir,
	startCluster,
	stopCluster,
	isClusterRunning
} from './postgres';
import { portInUse } from './ports';
import { runMigrations } from './migrate';
import { startMail, startS3, type StandIn } from './standins';

/** A stand-in that the fault tests can stop and start again under the running app. */
export interface RestartableStandIn {
	name: string;
	readonly running: boolean;
	stop(): Promise<void>;
	start(): Promise<void>;
}

export interface RunningServices {
	stop(): Promise<void>;
	pgDataDir: string;
	standIns: Record<string, RestartableStandIn>;
}

async function restartable(
	name: string,
	make: () => Promise<StandIn>
): Promise<RestartableStandIn> {
	let current: StandIn | null = await make();
	return {
		name,
		get running() {
			return current !== null;
		},
		async stop() {
			const was = current;
			current = null;
			await was?.stop();
		},
		async start() {
			current ??= await make();
		}
	};
}

export class PortBusyError extends Error {}

export async function startServices(
	profile: Profile,
	opts: { log?: (line: string) => void; fresh?: boolean } = {}
): Promise<RunningServices> {
	const log = opts.log ?? (() => {});
	const c = serviceConfig(profile);
	mkdirSync(c.dataDir, { recursive: true });
	const pgDir = pgDataDir(c.dataDir);

	if (isClusterRunning(pgDir)) {
		throw new PortBusyError(
			`PostgreSQL of ${c.dataDir} is already running: another \`npm ${profile === 'test' ? 'test' : 'start'}\` seems to be using it. Stop that one first.`
		);
	}
	for (const [name, port] of [
		['PostgreSQL', c.pgPort],
		['S3 stand-in', c.s3Port],
		['SMTP stand-in', c.smtpPort],
		['mail inbox', c.mailWebPort],
		['payment stand-in', c.payPort]
	] as const) {
		if (await portInUse(port)) {
			throw new PortBusyError(
				`Port ${port} on 127.0.0.1 (for the ${name}) is in use. Is another copy running? Stop it, or set another port (see .env.example).`
			);
		}
	}

	// Only now, with nothing of ours running, may a throwaway data folder be wiped.
	if (opts.fresh) rmSync(c.dataDir, { recursive: true, force: true });
	mkdirSync(c.dataDir, { recursive: true });

	const started: RestartableStandIn[] = [];
	const stop = async () => {
		for (const s of [...started].reverse()) await s.stop().catch(() => {});
		stopCluster(pgDir);
	};
	try {
		initCluster(pgDir);
		startCluster({ dataDir: pgDir, port: c.pgPort, database: c.pgDatabase });
		await ensureDatabase({ dataDir: pgDir, port: c.pgPort, database: c.pgDatabase });
		await runMigrations(process.env.DATABASE_URL ?? databaseUrl(profile));
		log(`PostgreSQL  127.0.0.1:${c.pgPort} (database ${c.pgDatabase}, data in ${pgDir})`);
		started.push(
			await restartable('s3', () =>
				startS3({ port: c.s3Port, dataDir: c.dataDir, bucket: c.s3Bucket })
			)
		);
		log(`S3 stand-in http://127.0.0.1:${c.s3Port} (bucket ${c.s3Bucket})`);
		started.push(
			await restartable('mail', () =>
				startMail({
					smtpPort: c.smtpPort,
					webPort: c.mailWebPort,
					dataDir: profile === 'dev' ? c.dataDir : undefined
				})
			)
		);
		log(`SMTP        127.0.0.1:${c.smtpPort}, inbox http://127.0.0.1:${c.mailWebPort}`);
		const env = appEnv(profile);
		started.push(
			await restartable('payments', () =>
				startPayStandIn({
					port: c.payPort,
					apiKey: env.PAYMENTS_SECRET_KEY,
					webhookSecret: env.PAYMENTS_WEBHOOK_SECRET,
					webhookUrl: `${env.ORIGIN}/api/payments/webhook`
				})
			)
		);
		log(
			`Payments    http://127.0.0.1:${c.payPort} (provider stand-in; webhooks to ${env.ORIGIN}/api/payments/webhook)`
		);
	} catch (error) {
		await stop();
		throw error;
	}
	return { stop, pgDataDir: pgDir, standIns: Object.fromEntries(started.map((s) => [s.name, s])) };
}

/** Stops the services on Ctrl-C or SIGTERM, once. */
export function stopOnSignals(stop: () => Promise<void>, extra: () => void = () => {}): void {
	let stopping = false;
	const handler = (signal: NodeJS.Signals) => {
		if (stopping) return;
		stopping = true;
		console.log(`\n${signal}: stopping…`);
		extra();
		stop().finally(() => process.exit(0));
	};
	process.on('SIGINT', handler);
	process.on('SIGTERM', handler);
}
