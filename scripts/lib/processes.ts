// Which process is which, from Linux's /proc: what a launcher needs to tell its own leftovers
// (after a crash or `kill -9`) from other programs before it stops anything.
import { readdirSync, readFileSync, readlinkSync } from 'node:fs';

/** The start time of a process (clock ticks since boot), which with the pid names it for good. */
export function processStartTime(pid: number): number | null {
	try {
		const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
		// The command name in parentheses may hold spaces: count fields after its closing one.
		const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
		return Number(fields[19]);
	} catch {
		return null;
	}
}

function isZombie(pid: number): boolean {
	try {
		const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
		return stat.slice(stat.lastIndexOf(')') + 2).startsWith('Z');
	} catch {
		return false;
	}
}

/** True when the process `pid` still runs and is the one that started at `startTime`. */
export function isSameProcess(pid: number, startTime: number): boolean {
	return processStartTime(pid) === startTime && !isZombie(pid);
}

export interface ProcessInfo {
	pid: number;
	args: string[];
	cwd: string | null;
	/** The launcher that started it (`pid:startTime` from RILLSTONE_LAUNCHER), when one did. */
	launcher: string | null;
}

function launcherOf(pid: number): string | null {
	try {
		const environ = readFileSync(`/proc/${pid}/environ`, 'utf8').split('\0');
		return environ.find((e) => e.startsWith('RILLSTONE_LAUNCHER='))?.slice(19) ?? null;
	} catch {
		return null;
	}
}

/** True for a process a launcher started and that outlived it (the launcher was killed). */
export function outlivedItsLauncher(info: ProcessInfo): boolean {
	if (!info.launcher) return false;
	const [pid, startTime] = info.launcher.split(':').map(Number);
	return !isSameProcess(pid, startTime);
}

export function processInfo(pid: number): ProcessInfo | null {
	try {
		const args = readFileSync(`/proc/${pid}/cmdline`, 'utf8').split('\0').filter(Boolean);
		let cwd: string | null = null;
		try {
			cwd = readlinkSync(`/proc/${pid}/cwd`);
		} catch {
			// another user's process: its folder is not ours to see
		}
		return { pid, args, cwd, launcher: launcherOf(pid) };
	} catch {
		return null;
	}
}

function listeningInodes(port: number): Set<string> {
	const inodes = new Set<string>();
	const hexPort = port.toString(16).toUpperCase().padStart(4, '0');
	for (const table of ['/proc/net/tcp', '/proc/net/tcp6']) {
		let lines: string[];
		try {
			lines = readFileSync(table, 'utf8').trim().split('\n').slice(1);
		} catch {
			continue;
		}
		for (const line of lines) {
			const [, local, , state, , , , , , inode] = line.trim().split(/\s+/);
			if (state === '0A' && local.endsWith(`:${hexPort}`)) inodes.add(inode);
		}
	}
	return inodes;
}

/** The process listening on a TCP port, when this user may see it (root sees every process). */
export function portHolder(port: number): ProcessInfo | null {
	const inodes = listeningInodes(port);
	if (inodes.size === 0) return null;
	const sockets = new Set([...inodes].map((inode) => `socket:[${inode}]`));
	for (const entry of readdirSync('/proc')) {
		if (!/^\d+$/.test(entry)) continue;
		let fds: string[];
		try {
			fds = readdirSync(`/proc/${entry}/fd`);
		} catch {
			continue;
		}
		for (const fd of fds) {
			try {
				if (sockets.has(readlinkSync(`/proc/${entry}/fd/${fd}`))) return processInfo(Number(entry));
			} catch {
				// the descriptor closed while we looked
			}
		}
	}
	return null;
}

/** Sends SIGTERM, then SIGKILL after `graceMs`; resolves once the process is gone. */
export async function stopProcess(pid: number, graceMs = 5_000): Promise<void> {
	const startTime = processStartTime(pid);
	if (startTime === null) return;
	const gone = () => !isSameProcess(pid, startTime);
	const signal = (sig: NodeJS.Signals) => {
		try {
			process.kill(pid, sig);
		} catch {
			// already gone
		}
	};
	signal('SIGTERM');
	const deadline = Date.now() + graceMs;
	while (!gone() && Date.now() < deadline) await new Promise((r) => setTimeout(r, 100));
	if (gone()) return;
	signal('SIGKILL');
	const last = Date.now() + 5_000;
	while (!gone() && Date.now() < last) await new Promise((r) => setTimeout(r, 50));
}
