// A project-local PostgreSQL cluster from Debian's binaries, on loopback only.
// As root the server runs as the `postgres` system user, since it refuses to run as root.
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, chownSync, statSync } from 'node:fs';
import { join } from 'node:path';
import postgres from 'postgres';

const isRoot = process.getuid?.() === 0;

export interface PgCluster {
	dataDir: string;
	port: number;
	database: string;
}

function findBinDir(): string | null {
	const base = '/usr/lib/postgresql';
	if (!existsSync(base)) return null;
	const versions = readdirSync(base)
		.filter((v) => existsSync(join(base, v, 'bin', 'initdb')))
		.sort((a, b) => Number(b) - Number(a));
	return versions.length ? join(base, versions[0], 'bin') : null;
}

export function postgresBinDir(): string {
	let dir = findBinDir();
	if (!dir && isRoot) {
		console.log("PostgreSQL binaries not found: installing Debian's postgresql package…");
		execFileSync('apt-get', ['update', '-qq'], { stdio: 'inherit' });
		execFileSync('apt-get', ['install', '-y', '-qq', 'postgresql'], {
			stdio: 'inherit',
			env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' }
		});
		dir = findBinDir();
	}
	if (!dir) {
		throw new Error(
			'PostgreSQL server binaries were not found under /usr/lib/postgresql. Install them with `apt-get install postgresql`.'
		);
	}
	return dir;
}

function run(bin: string, args: string[], opts: { allowFail?: boolean } = {}) {
	const cmd = isRoot ? 'runuser' : join(postgresBinDir(), bin);
	const fullArgs = isRoot ? ['-u', 'postgres', '--', join(postgresBinDir(), bin), ...args] : args;
	const result = spawnSync(cmd, fullArgs, { encoding: 'utf8' });
	if (result.status !== 0 && !opts.allowFail) {
		throw new Error(`${bin} ${args.join(' ')} failed:\n${result.stderr || result.stdout}`);
	}
	return result;
}

export function pgDataDir(root: string): string {
	return join(root, 'pg');
}

export function isClusterRunning(dataDir: string): boolean {
	if (!existsSync(join(dataDir, 'PG_VERSION'))) return false;
	return run('pg_ctl', ['-D', dataDir, 'status'], { allowFail: true }).status === 0;
}

export function initCluster(dataDir: string): void {
	if (existsSync(join(dataDir, 'PG_VERSION'))) return;
	mkdirSync(dataDir, { recursive: true, mode: 0o700 });
	if (isRoot) {
		const pgUser = spawnSync('id', ['-u', 'postgres'], { encoding: 'utf8' });
		const pgGroup = spawnSync('id', ['-g', 'postgres'], { encoding: 'utf8' });
		if (pgUser.status !== 0) throw new Error('the postgres system user is missing');
		chownSync(dataDir, Number(pgUser.stdout.trim()), Number(pgGroup.stdout.trim()));
	}
	run('initdb', ['-D', dataDir, '-A', 'trust', '-U', 'app', '-E', 'UTF8', '--locale=C.UTF-8']);
}

export function startCluster(c: PgCluster): void {
	if (isClusterRunning(c.dataDir)) return;
	if (isRoot && statSync(c.dataDir).uid === 0) throw new Error(`${c.dataDir} is owned by root`);
	const opts = `-p ${c.port} -k ${c.dataDir} -c listen_addresses=127.0.0.1 -c max_connections=200 -c fsync=${process.env.PG_FSYNC ?? 'on'}`;
	run('pg_ctl', [
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
}

export function stopCluster(dataDir: string): void {
	if (!isClusterRunning(dataDir)) return;
	run('pg_ctl', ['-D', dataDir, '-m', 'fast', '-w', 'stop'], { allowFail: true });
}

export async function ensureDatabase(c: PgCluster): Promise<void> {
	const sql = postgres({
		host: '127.0.0.1',
		port: c.port,
		user: 'app',
		database: 'postgres',
		max: 1,
		onnotice: () => {}
	});
	try {
		const rows = await sql`select 1 from pg_database where datname = ${c.database}`;
		if (rows.length === 0) await sql.unsafe(`create database "${c.database}"`);
	} finally {
		await sql.end();
	}
}

export async function dropDatabase(c: PgCluster): Promise<void> {
	const sql = postgres({
		host: '127.0.0.1',
		port: c.port,
		user: 'app',
		database: 'postgres',
		max: 1,
		onnotice: () => {}
	});
	try {
		await sql.unsafe(`drop database if exists "${c.database}" with (force)`);
	} finally {
		await sql.end();
	}
}
