// A project-local PostgreSQL cluster from Debian's binaries, reached over TCP on loopback only.
// No Unix socket: its path must fit in 107 bytes and lie where the server's user may write.
// As root the server runs as the `postgres` system user, since it refuses to run as root. When
// that user cannot enter the project's data folder (a home or `mktemp -d` folder has mode 0700),
// the cluster lives in the postgres user's home instead, in a folder named after a hash of the
// data folder's path: two clones never share one, and the next start finds it again. The user's
// own folders keep their permissions.
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import {
	chownSync,
	existsSync,
	mkdirSync,
	readdirSync,
	readFileSync,
	realpathSync,
	rmSync,
	statSync,
	writeFileSync
} from 'node:fs';
import { basename, dirname, join } from 'node:path';
import postgres from 'postgres';
import { diskFullMessage, LauncherError } from './errors';

const isRoot = process.getuid?.() === 0;
const BINARIES = '/usr/lib/postgresql';

export interface PgCluster {
	dataDir: string;
	port: number;
	database: string;
}

function findBinDir(): string | null {
	if (!existsSync(BINARIES)) return null;
	const versions = readdirSync(BINARIES)
		.filter((v) => existsSync(join(BINARIES, v, 'bin', 'initdb')))
		.sort((a, b) => Number(b) - Number(a));
	return versions.length ? join(BINARIES, versions[0], 'bin') : null;
}

function installPostgres(): boolean {
	console.log("PostgreSQL binaries not found: installing Debian's postgresql package…");
	const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
	return [
		['update', '-qq'],
		['install', '-y', '-qq', 'postgresql']
	].every((args) => spawnSync('apt-get', args, { stdio: 'inherit', env }).status === 0);
}

let binDir: string | null = null;

export function postgresBinDir(): string {
	if (binDir) return binDir;
	binDir = findBinDir();
	if (!binDir && isRoot) {
		const installed = installPostgres();
		binDir = findBinDir();
		if (!binDir) {
			throw new LauncherError(
				`PostgreSQL's server binaries are missing and \`apt-get install postgresql\` ${installed ? 'did not provide them' : 'failed (see above)'}: install Debian's postgresql package by hand, then start again.`
			);
		}
	}
	if (!binDir) {
		throw new LauncherError(
			`PostgreSQL's server binaries are missing (nothing under ${BINARIES}): install them as root with \`apt-get install postgresql\`, then start again.`
		);
	}
	return binDir;
}

/** The major version of the binaries in use, from Debian's /usr/lib/postgresql/<major>/bin. */
function binariesMajor(): string {
	return basename(dirname(postgresBinDir()));
}

interface ServerUser {
	uid: number;
	gid: number;
	home: string;
}

let serverUserEntry: ServerUser | null = null;

/** The `postgres` system user the server runs as when the launcher is root. */
function serverUser(): ServerUser {
	if (serverUserEntry) return serverUserEntry;
	const entry = spawnSync('getent', ['passwd', 'postgres'], { encoding: 'utf8' });
	if (entry.status !== 0) {
		throw new LauncherError(
			"PostgreSQL refuses to run as root and this machine has no `postgres` system user: install Debian's postgresql package (it creates that user), or start as a normal user."
		);
	}
	const [, , uid, gid, , home] = entry.stdout.trim().split(':');
	serverUserEntry = { uid: Number(uid), gid: Number(gid), home: home || '/var/lib/postgresql' };
	return serverUserEntry;
}

/** Runs a PostgreSQL program as the user the server runs as. */
function run(bin: string, args: string[]) {
	const exe = join(postgresBinDir(), bin);
	const [cmd, fullArgs] = isRoot
		? ['runuser', ['-u', 'postgres', '--', exe, ...args]]
		: [exe, args];
	// From `/`: the server's user may not be allowed into the folder the launcher was started in.
	return spawnSync(cmd, fullArgs, { encoding: 'utf8', cwd: '/' });
}

function serverCanEnter(dir: string): boolean {
	if (!isRoot) return true;
	return (
		spawnSync('runuser', ['-u', 'postgres', '--', 'test', '-x', dir], { cwd: '/' }).status === 0
	);
}

/** A folder the server's user owns (mode 0700), made if missing. */
function makeServerDir(dir: string): void {
	mkdirSync(dir, { recursive: true, mode: 0o700 });
	if (isRoot) chownSync(dir, serverUser().uid, serverUser().gid);
}

/** Where the cluster of `root` lives when the server's user cannot enter `root`. */
export function outsideClusterHome(root: string): string {
	const hash = createHash('sha256').update(realpathSync(root)).digest('hex').slice(0, 16);
	return join(serverUser().home, 'rillstone', hash);
}

export interface ClusterPlace {
	dataDir: string;
	/** True when the cluster lives outside the project, because the server's user cannot enter it. */
	outside: boolean;
}

/** The cluster folder for a data folder `root` (which must exist): `root/pg` when the server can reach it. */
export function clusterPlace(root: string): ClusterPlace {
	const inside = join(root, 'pg');
	if (!isRoot) return { dataDir: inside, outside: false };
	const home = outsideClusterHome(root);
	const outside = join(home, 'pg');
	const reachable = serverCanEnter(root);
	const hasCluster = (dir: string) => existsSync(join(dir, 'PG_VERSION'));
	if (reachable && (hasCluster(inside) || !hasCluster(outside))) {
		return { dataDir: inside, outside: false };
	}
	makeServerDir(dirname(home));
	makeServerDir(home);
	writeFileSync(
		join(home, 'belongs-to.txt'),
		`The PostgreSQL cluster of Rillstone's data folder ${realpathSync(root)}.\nDelete this folder once that clone is gone.\n`
	);
	return { dataDir: outside, outside: true };
}

/** Deletes a data folder and, as root, the cluster kept outside it. */
export function removeData(root: string): void {
	if (isRoot && existsSync(root)) {
		rmSync(outsideClusterHome(root), { recursive: true, force: true });
	}
	rmSync(root, { recursive: true, force: true });
}

/**
 * The pid of the server running on this cluster, or null. A postmaster.pid left by a crash
 * (its process gone, or its pid since reused by another program) does not count.
 */
export function runningServerPid(dataDir: string): number | null {
	try {
		const pid = Number(readFileSync(join(dataDir, 'postmaster.pid'), 'utf8').split('\n')[0]);
		const args = readFileSync(`/proc/${pid}/cmdline`, 'utf8').split('\0');
		if (basename(args[0]) !== 'postgres') return null;
		// The same folder, however it was spelled (through a symbolic link, say).
		const served = args[args.indexOf('-D') + 1];
		return served && realpathSync(served) === realpathSync(dataDir) ? pid : null;
	} catch {
		return null;
	}
}

export function isClusterRunning(dataDir: string): boolean {
	return runningServerPid(dataDir) !== null;
}

function lastLine(output: string): string {
	const lines = output.trim().split('\n').filter(Boolean);
	return (lines.findLast((l) => /FATAL|ERROR|error:/.test(l)) ?? lines.at(-1) ?? '').trim();
}

export function initCluster(dataDir: string): void {
	if (existsSync(join(dataDir, 'PG_VERSION'))) return;
	makeServerDir(dataDir);
	const result = run('initdb', [
		'-D',
		dataDir,
		'-A',
		'trust',
		'-U',
		'app',
		'-E',
		'UTF8',
		'--locale=C.UTF-8'
	]);
	if (result.status === 0) return;
	const output = `${result.stderr}\n${result.stdout}`;
	throw new LauncherError(
		diskFullMessage(output, dataDir) ??
			`PostgreSQL could not create its cluster in ${dataDir} (${lastLine(output)}): fix that, or delete the folder, then start again.`
	);
}

function checkMajorVersion(dataDir: string): void {
	const file = join(dataDir, 'PG_VERSION');
	if (!existsSync(file)) return;
	const found = readFileSync(file, 'utf8').trim();
	const ours = binariesMajor();
	if (found !== ours) {
		throw new LauncherError(
			`${dataDir} holds a PostgreSQL ${found} cluster but this machine has PostgreSQL ${ours}: install PostgreSQL ${found}'s server, or move that folder away to start with a new database.`
		);
	}
}

function startFailure(c: PgCluster, output: string): string {
	const logFile = join(c.dataDir, 'server.log');
	const log = existsSync(logFile)
		? readFileSync(logFile, 'utf8').split('\n').slice(-30).join('\n')
		: '';
	const all = `${output}\n${log}`;
	const full = diskFullMessage(all, c.dataDir);
	if (full) return full;
	if (/could not bind .*Address already in use/.test(log)) {
		return `Port ${c.port} on 127.0.0.1 (for PostgreSQL) is in use by another program: stop it, or set PG_PORT to a free port.`;
	}
	return `PostgreSQL did not start on port ${c.port} (${lastLine(log || output)}): its log is ${logFile}.`;
}

export function startCluster(c: PgCluster): void {
	if (isClusterRunning(c.dataDir)) return;
	checkMajorVersion(c.dataDir);
	// A postmaster.pid whose server is gone would stop the start if its pid now belongs to someone else.
	rmSync(join(c.dataDir, 'postmaster.pid'), { force: true });
	if (isRoot && statSync(c.dataDir).uid === 0) {
		throw new LauncherError(
			`${c.dataDir} belongs to root, but the server runs as the postgres user: delete that folder, then start again.`
		);
	}
	const opts = `-p ${c.port} -k '' -c listen_addresses=127.0.0.1 -c max_connections=200 -c fsync=${process.env.PG_FSYNC ?? 'on'}`;
	const result = run('pg_ctl', [
		'-D',
		c.dataDir,
		'-o',
		opts,
		'-l',
		join(c.dataDir, 'server.log'),
		'-w',
		'-t',
		'60',
		'start'
	]);
	if (result.status !== 0) {
		throw new LauncherError(startFailure(c, `${result.stderr}\n${result.stdout}`));
	}
}

export function stopCluster(dataDir: string): void {
	if (!isClusterRunning(dataDir)) return;
	const fast = run('pg_ctl', ['-D', dataDir, '-m', 'fast', '-w', '-t', '10', 'stop']);
	if (fast.status !== 0) run('pg_ctl', ['-D', dataDir, '-m', 'immediate', '-w', 'stop']);
}

async function onMaintenanceDb<T>(
	port: number,
	work: (sql: postgres.Sql) => Promise<T>
): Promise<T> {
	const sql = postgres({
		host: '127.0.0.1',
		port,
		user: 'app',
		database: 'postgres',
		max: 1,
		onnotice: () => {}
	});
	try {
		return await work(sql);
	} finally {
		await sql.end();
	}
}

export async function ensureDatabase(c: PgCluster): Promise<void> {
	await onMaintenanceDb(c.port, async (sql) => {
		const rows = await sql`select 1 from pg_database where datname = ${c.database}`;
		if (rows.length === 0) await sql.unsafe(`create database "${c.database}"`);
	});
}

export async function dropDatabase(c: PgCluster): Promise<void> {
	await onMaintenanceDb(c.port, (sql) =>
		sql.unsafe(`drop database if exists "${c.database}" with (force)`)
	);
}
