// The services launcher (`npm run services`, the same start as `npm start` and `npm test`) run
// as its own process, the way a person runs it: from a folder of mode 0700 (as root the server's
// postgres user cannot enter it), after the previous launcher was killed with SIGKILL, and the
// one-sentence errors. Every launcher here uses free ports of its own and a throwaway folder.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import {
	chmodSync,
	existsSync,
	mkdirSync,
	mkdtempSync,
	rmSync,
	statSync,
	writeFileSync
} from 'node:fs';
import { createServer, type AddressInfo, type Server } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import postgres from 'postgres';
import { afterEach, describe, expect, it } from 'vitest';
import {
	outsideClusterHome,
	removeData,
	runningServerPid,
	stopCluster
} from '../../scripts/lib/postgres';
import { portInUse } from '../../scripts/lib/ports';

const isRoot = process.getuid?.() === 0;

function freePort(): Promise<number> {
	return new Promise((resolve, reject) => {
		const server = createServer();
		server.once('error', reject);
		server.listen(0, '127.0.0.1', () => {
			const { port } = server.address() as AddressInfo;
			server.close(() => resolve(port));
		});
	});
}

interface Ports {
	PG_PORT: string;
	S3_PORT: string;
	SMTP_PORT: string;
	MAIL_WEB_PORT: string;
	PAY_PORT: string;
	PORT: string;
}

async function freePorts(): Promise<Ports> {
	const [pg, s3, smtp, web, pay, app] = await Promise.all(Array.from({ length: 6 }, freePort));
	return {
		PG_PORT: String(pg),
		S3_PORT: String(s3),
		SMTP_PORT: String(smtp),
		MAIL_WEB_PORT: String(web),
		PAY_PORT: String(pay),
		PORT: String(app)
	};
}

interface Launcher {
	child: ChildProcess;
	output: () => string;
	exited: Promise<number | null>;
	waitFor(text: string, ms?: number): Promise<void>;
}

const launchers: Launcher[] = [];
const folders: string[] = [];

function launch(dataDir: string, ports: Ports): Launcher {
	const env: NodeJS.ProcessEnv = {
		...process.env,
		...ports,
		RILLSTONE_DATA_DIR: dataDir,
		PG_FSYNC: 'off'
	};
	// The launcher's own defaults, not the ones `npm test` hands to this file.
	delete env.DATABASE_URL;
	delete env.PG_DATABASE;
	const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/services.ts'], {
		env,
		stdio: ['ignore', 'pipe', 'pipe']
	});
	let output = '';
	child.stdout?.on('data', (chunk) => (output += chunk));
	child.stderr?.on('data', (chunk) => (output += chunk));
	const exited = new Promise<number | null>((resolve) => child.on('exit', resolve));
	const launcher: Launcher = {
		child,
		output: () => output,
		exited,
		async waitFor(text, ms = 45_000) {
			const deadline = Date.now() + ms;
			while (!output.includes(text)) {
				if (child.exitCode !== null) throw new Error(`the launcher exited:\n${output}`);
				if (Date.now() > deadline) throw new Error(`no "${text}" within ${ms} ms:\n${output}`);
				await new Promise((r) => setTimeout(r, 50));
			}
		}
	};
	launchers.push(launcher);
	return launcher;
}

/** The launcher's own line saying where the cluster lives. */
function clusterDir(launcher: Launcher): string {
	const match = launcher.output().match(/data in (.+?\/pg)\b/);
	if (!match) throw new Error(`no "data in" line:\n${launcher.output()}`);
	return match[1];
}

/** A throwaway folder of mode 0700 (what `mktemp -d` makes), its name with a space. */
function privateFolder(): string {
	const dir = mkdtempSync(join(tmpdir(), 'rillstone launcher '));
	folders.push(dir);
	return dir;
}

async function stoppedWithin(launcher: Launcher, ms: number): Promise<number | null> {
	launcher.child.kill('SIGTERM');
	return Promise.race([
		launcher.exited,
		new Promise<never>((_, reject) =>
			setTimeout(() => reject(new Error(`still running ${ms} ms after SIGTERM`)), ms)
		)
	]);
}

async function countMarks(port: string): Promise<number> {
	const sql = postgres({
		host: '127.0.0.1',
		port: Number(port),
		user: 'app',
		database: 'rillstone',
		max: 1,
		onnotice: () => {}
	});
	try {
		await sql`create table if not exists launcher_mark (at timestamptz default now())`;
		await sql`insert into launcher_mark default values`;
		const [{ n }] = await sql<{ n: number }[]>`select count(*)::int as n from launcher_mark`;
		return n;
	} finally {
		await sql.end();
	}
}

afterEach(async () => {
	for (const launcher of launchers.splice(0)) {
		if (launcher.child.exitCode === null && launcher.child.signalCode === null) {
			launcher.child.kill('SIGKILL');
			await launcher.exited;
		}
	}
	for (const dir of folders.splice(0)) {
		const dataDir = join(dir, '.data');
		if (existsSync(dataDir)) {
			stopCluster(join(dataDir, 'pg'));
			if (isRoot) stopCluster(join(outsideClusterHome(dataDir), 'pg'));
			removeData(dataDir);
		}
		rmSync(dir, { recursive: true, force: true });
	}
});

describe('the services launcher', () => {
	it('starts, stops and restarts its cluster from a folder of mode 0700 (over a stale postmaster.pid), keeping the data and the mode', async () => {
		const dir = privateFolder();
		expect(statSync(dir).mode & 0o777).toBe(0o700);
		const dataDir = join(dir, '.data');
		const ports = await freePorts();

		const first = launch(dataDir, ports);
		await first.waitFor('Services running.');
		const pgDir = clusterDir(first);
		if (isRoot) {
			// The postgres user cannot enter the folder: the cluster lives in its home instead.
			expect(pgDir).toBe(join(outsideClusterHome(dataDir), 'pg'));
			expect(first.output()).toContain(`(the postgres user cannot enter ${dataDir})`);
		} else {
			expect(pgDir).toBe(join(dataDir, 'pg'));
		}
		expect(await countMarks(ports.PG_PORT)).toBe(1);
		expect(await stoppedWithin(first, 15_000)).toBe(0);
		expect(await portInUse(Number(ports.PG_PORT))).toBe(false);
		expect(runningServerPid(pgDir)).toBeNull();
		// And as after a power cut: a postmaster.pid whose pid now belongs to another program
		// (this test's own pid stands for it).
		writeFileSync(
			join(pgDir, 'postmaster.pid'),
			`${process.pid}\n${pgDir}\n1700000000\n${ports.PG_PORT}\n\n127.0.0.1\n  0  0\nready   \n`
		);

		const second = launch(dataDir, ports);
		await second.waitFor('Services running.');
		expect(clusterDir(second)).toBe(pgDir);
		expect(await countMarks(ports.PG_PORT)).toBe(2);
		expect(await stoppedWithin(second, 15_000)).toBe(0);
		expect(runningServerPid(pgDir)).toBeNull();
		expect(statSync(dir).mode & 0o777).toBe(0o700);
	});

	it('comes up after its launcher was killed with SIGKILL, stopping the server that one left running', async () => {
		const dataDir = join(privateFolder(), '.data');
		const ports = await freePorts();
		const killed = launch(dataDir, ports);
		await killed.waitFor('Services running.');
		const pgDir = clusterDir(killed);
		killed.child.kill('SIGKILL');
		await killed.exited;
		const leftover = runningServerPid(pgDir);
		expect(leftover, 'PostgreSQL outlives a launcher killed with SIGKILL').not.toBeNull();

		const next = launch(dataDir, ports);
		await next.waitFor('Services running.');
		expect(next.output()).toContain(
			`Stopping the PostgreSQL server (pid ${leftover}) that an earlier run left running`
		);
		expect(runningServerPid(pgDir)).not.toBe(leftover);
		expect(await countMarks(ports.PG_PORT)).toBe(1);
		expect(await stoppedWithin(next, 15_000)).toBe(0);
		expect(runningServerPid(pgDir)).toBeNull();
	});

	it('names the busy port and the setting that moves it when another program holds it', async () => {
		const ports = await freePorts();
		const holder: Server = createServer();
		await new Promise<void>((resolve) =>
			holder.listen(Number(ports.PAY_PORT), '127.0.0.1', resolve)
		);
		try {
			const launcher = launch(join(privateFolder(), '.data'), ports);
			expect(await launcher.exited).toBe(1);
			expect(launcher.output().trim()).toBe(
				`Port ${ports.PAY_PORT} on 127.0.0.1 (for the payment stand-in) is in use by another program (pid ${process.pid}, node): stop it, or set PAY_PORT to a free port.`
			);
		} finally {
			await new Promise((resolve) => holder.close(resolve));
		}
	});

	it('refuses a data folder from another PostgreSQL major version in one sentence', async () => {
		const dir = privateFolder();
		const dataDir = join(dir, '.data');
		mkdirSync(join(dataDir, 'pg'), { recursive: true });
		writeFileSync(join(dataDir, 'pg', 'PG_VERSION'), '9\n');
		// A folder the postgres user can enter, so that the launcher looks at this cluster.
		for (const d of [dir, dataDir, join(dataDir, 'pg')]) chmodSync(d, 0o755);
		const launcher = launch(dataDir, await freePorts());
		expect(await launcher.exited).toBe(1);
		expect(launcher.output().trim()).toMatch(
			new RegExp(
				`^${escape(join(dataDir, 'pg'))} holds a PostgreSQL 9 cluster but this machine has PostgreSQL \\d+: install PostgreSQL 9's server, or move that folder away to start with a new database\\.$`
			)
		);
	});

	it.runIf(isRoot)('says in one sentence that the disk is full', async () => {
		const dir = privateFolder();
		chmodSync(dir, 0o755);
		const mounted = spawnStatus('mount', ['-t', 'tmpfs', '-o', 'size=2m,mode=0755', 'tmpfs', dir]);
		expect(mounted, 'a 2 MB tmpfs stands for the full disk').toBe(0);
		try {
			const dataDir = join(dir, '.data');
			const launcher = launch(dataDir, await freePorts());
			expect(await launcher.exited).toBe(1);
			expect(launcher.output().trim()).toBe(
				`The disk holding ${join(dataDir, 'pg')} is full: free some space on it, then start again.`
			);
		} finally {
			spawnStatus('umount', [dir]);
		}
	});
});

function escape(text: string): string {
	return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}

function spawnStatus(cmd: string, args: string[]): number | null {
	return spawnSync(cmd, args).status;
}
