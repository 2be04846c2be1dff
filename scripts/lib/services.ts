// Starts PostgreSQL and the S3 and SMTP stand-ins for a profile, on 127.0.0.1 only.
import { mkdirSync, readFileSync, realpathSync, rmSync, writeFileSync } from 'node:fs';
import { basename, join } from 'node:path';
import { appEnv, serviceConfig, databaseUrl, type Profile, type ServiceConfig } from './config';
import { diskFullMessage, LauncherError } from './errors';
import { startPayStandIn } from './pay-standin';
import {
	clusterPlace,
	ensureDatabase,
	initCluster,
	removeData,
	runningServerPid,
	startCluster,
	stopCluster
} from './postgres';
import { portInUse } from './ports';
import {
	isSameProcess,
	outlivedItsLauncher,
	portHolder,
	processStartTime,
	stopProcess
} from './processes';
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

interface LauncherLock {
	pid: number;
	startTime: number;
	command: string;
}

const lockFile = (dataDir: string) => join(dataDir, 'launcher.json');

function commandName(): string {
	const script = process.argv.find((a) => /scripts[\\/]\w+\.ts$/.test(a)) ?? process.argv[1] ?? '';
	const name = basename(script, '.ts');
	if (name === 'start') return process.argv.includes('--dev') ? '`npm run dev`' : '`npm start`';
	if (name === 'test') return '`npm test`';
	if (name === 'services') return '`npm run services`';
	return `${basename(process.argv[1] ?? 'node')} (pid ${process.pid})`;
}

/** The launcher that holds this data folder, if it still runs (a crashed one leaves its file behind). */
function liveLauncher(dataDir: string): LauncherLock | null {
	try {
		const lock = JSON.parse(readFileSync(lockFile(dataDir), 'utf8')) as LauncherLock;
		if (lock.pid === process.pid) return null;
		return isSameProcess(lock.pid, lock.startTime) ? lock : null;
	} catch {
		return null;
	}
}

function claimDataDir(dataDir: string): void {
	const lock: LauncherLock = {
		pid: process.pid,
		startTime: processStartTime(process.pid) ?? 0,
		command: commandName()
	};
	writeFileSync(lockFile(dataDir), JSON.stringify(lock));
}

function releaseDataDir(dataDir: string): void {
	try {
		const lock = JSON.parse(readFileSync(lockFile(dataDir), 'utf8')) as LauncherLock;
		if (lock.pid === process.pid) rmSync(lockFile(dataDir));
	} catch {
		// nothing to release
	}
}

let signalled: NodeJS.Signals | null = null;
const stopsOnSignal = new Set<() => Promise<void>>();

export interface NamedPort {
	name: string;
	port: number;
	/** The environment variable that moves it. */
	setting: string;
}

const LAUNCHER_SCRIPT = /scripts[\\/](start|test|services)\.ts$/;

/**
 * Frees each port held by a leftover of ours (a process a launcher of this folder started and
 * that outlived it); a port held by anything else stops the start with a message naming the
 * port and the setting that moves it.
 */
async function freePorts(ports: NamedPort[], log: (line: string) => void): Promise<void> {
	const project = realpathSync('.');
	for (const { name, port, setting } of ports) {
		if (!(await portInUse(port))) continue;
		const holder = portHolder(port);
		const launcher = holder?.args.find((a) => LAUNCHER_SCRIPT.test(a));
		if (holder && holder.cwd === project && outlivedItsLauncher(holder)) {
			log(
				`Stopping ${holder.args.slice(1).join(' ')} (pid ${holder.pid}), left over by an earlier run on port ${port}…`
			);
			await stopProcess(holder.pid);
			if (!(await portInUse(port))) continue;
		}
		const who = !holder
			? 'another program'
			: launcher && holder.cwd === project
				? `another Rillstone launcher of this folder (pid ${holder.pid})`
				: `another program (pid ${holder.pid}, ${basename(holder.args[0] ?? '?')})`;
		throw new LauncherError(
			`Port ${port} on 127.0.0.1 (for the ${name}) is in use by ${who}: stop it, or set ${setting} to a free port.`
		);
	}
}

function servicePorts(c: ServiceConfig): NamedPort[] {
	return [
		{ name: 'PostgreSQL server', port: c.pgPort, setting: 'PG_PORT' },
		{ name: 'S3 stand-in', port: c.s3Port, setting: 'S3_PORT' },
		{ name: 'SMTP stand-in', port: c.smtpPort, setting: 'SMTP_PORT' },
		{ name: 'mail inbox', port: c.mailWebPort, setting: 'MAIL_WEB_PORT' },
		{ name: 'payment stand-in', port: c.payPort, setting: 'PAY_PORT' }
	];
}

/** Stops a stand-in, giving up on it after a few seconds (an open browser tab can hold it). */
function stopWithin(standIn: RestartableStandIn, ms: number): Promise<void> {
	return Promise.race([
		standIn.stop().catch(() => {}),
		new Promise<void>((resolve) => setTimeout(resolve, ms).unref())
	]);
}

function asLauncherError(error: unknown, dataDir: string): unknown {
	const full = diskFullMessage(error, dataDir);
	return full && !(error instanceof LauncherError) ? new LauncherError(full) : error;
}

export async function startServices(
	profile: Profile,
	opts: { log?: (line: string) => void; fresh?: boolean; ports?: NamedPort[] } = {}
): Promise<RunningServices> {
	const log = opts.log ?? (() => {});
	const c = serviceConfig(profile);
	try {
		mkdirSync(c.dataDir, { recursive: true });
	} catch (error) {
		throw asLauncherError(error, c.dataDir);
	}

	const other = liveLauncher(c.dataDir);
	if (other) {
		throw new LauncherError(
			`${other.command} (pid ${other.pid}) is already running on ${c.dataDir}: stop it first (Ctrl-C in its terminal, or kill ${other.pid}).`
		);
	}
	claimDataDir(c.dataDir);

	// Stops what has started so far: a signal may come at any point of the start.
	const started: RestartableStandIn[] = [];
	let pgDir: string | null = null;
	let stopping: Promise<void> | null = null;
	const stop = () =>
		(stopping ??= (async () => {
			for (const s of [...started].reverse()) await stopWithin(s, 3_000);
			if (pgDir) stopCluster(pgDir);
			releaseDataDir(c.dataDir);
			stopsOnSignal.delete(stop);
		})());
	stopsOnSignal.add(stop);
	const unlessSignalled = () => {
		if (signalled) throw new LauncherError(`Stopped by ${signalled} before the services were up.`);
	};

	try {
		let place = clusterPlace(c.dataDir);
		const leftover = runningServerPid(place.dataDir);
		if (leftover) {
			log(`Stopping the PostgreSQL server (pid ${leftover}) that an earlier run left running…`);
			stopCluster(place.dataDir);
		}
		await freePorts([...servicePorts(c), ...(opts.ports ?? [])], log);
		unlessSignalled();

		// Only now, with nothing of ours running, may a throwaway data folder be wiped.
		if (opts.fresh) {
			removeData(c.dataDir);
			mkdirSync(c.dataDir, { recursive: true });
			claimDataDir(c.dataDir);
			place = clusterPlace(c.dataDir);
		}
		pgDir = place.dataDir;
		initCluster(pgDir);
		startCluster({ dataDir: pgDir, port: c.pgPort, database: c.pgDatabase });
		await ensureDatabase({ dataDir: pgDir, port: c.pgPort, database: c.pgDatabase });
		await runMigrations(process.env.DATABASE_URL ?? databaseUrl(profile));
		unlessSignalled();
		log(`PostgreSQL  127.0.0.1:${c.pgPort} (database ${c.pgDatabase})`);
		log(
			place.outside
				? `            data in ${pgDir} (the postgres user cannot enter ${c.dataDir})`
				: `            data in ${pgDir}`
		);
		started.push(
			await restartable('s3', () =>
				startS3({ port: c.s3Port, dataDir: c.dataDir, bucket: c.s3Bucket })
			)
		);
		unlessSignalled();
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
		unlessSignalled();
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
		unlessSignalled();
		log(
			`Payments    http://127.0.0.1:${c.payPort} (provider stand-in; webhooks to ${env.ORIGIN}/api/payments/webhook)`
		);
	} catch (error) {
		await stop();
		throw asLauncherError(error, c.dataDir);
	}
	return {
		stop,
		pgDataDir: pgDir as string,
		standIns: Object.fromEntries(started.map((s) => [s.name, s]))
	};
}

/**
 * On Ctrl-C, SIGTERM or a closed terminal: runs `stopOwn` (the launcher's children), then stops
 * every service started or starting in this process, then exits. Register it before starting
 * anything. Whatever is still up 14 seconds later is left to the tether of each child.
 */
export function stopOnSignals(stopOwn: () => Promise<void> = async () => {}): void {
	const handler = (signal: NodeJS.Signals) => {
		if (signalled) return;
		signalled = signal;
		console.log(`\n${signal}: stopping…`);
		setTimeout(() => process.exit(1), 14_000).unref();
		stopOwn()
			.catch(() => {})
			.then(() => Promise.all([...stopsOnSignal].map((stop) => stop())))
			.finally(() => process.exit(0));
	};
	process.on('SIGINT', handler);
	process.on('SIGTERM', handler);
	process.on('SIGHUP', handler);
}
