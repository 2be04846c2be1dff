// Child processes of the launchers: tethered (scripts/lib/tether.js) so that they stop when
// their launcher dies, even by `kill -9`, and stopped within a deadline on Ctrl-C.
import { spawn, type ChildProcess, type SpawnOptions } from 'node:child_process';
import { processStartTime } from './processes';

// A file URL: spaces in the project's path are escaped, so NODE_OPTIONS stays one option.
const TETHER = new URL('./tether.js', import.meta.url).href;

/** NODE_OPTIONS that load the tether into a Node process and every Node process it starts. */
export function tetheredNodeOptions(existing = process.env.NODE_OPTIONS ?? ''): string {
	const option = `--import=${TETHER}`;
	return existing.includes(option) ? existing : `${existing} ${option}`.trim();
}

export function spawnTethered(
	cmd: string,
	args: string[],
	opts: SpawnOptions & { env: NodeJS.ProcessEnv }
): ChildProcess {
	return spawn(cmd, args, {
		...opts,
		env: {
			...opts.env,
			NODE_OPTIONS: tetheredNodeOptions(opts.env.NODE_OPTIONS),
			// Names the launcher for good (pid and start time): a later start can tell its leftovers.
			RILLSTONE_LAUNCHER: `${process.pid}:${processStartTime(process.pid)}`
		}
	});
}

/** SIGTERM, then SIGKILL after `graceMs`; resolves once the child has exited. */
export function stopChild(child: ChildProcess, graceMs = 6_000): Promise<void> {
	if (child.exitCode !== null || child.signalCode !== null) return Promise.resolve();
	return new Promise((resolve) => {
		const force = setTimeout(() => child.kill('SIGKILL'), graceMs);
		child.once('exit', () => {
			clearTimeout(force);
			resolve();
		});
		child.kill('SIGTERM');
	});
}
