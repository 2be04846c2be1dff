// A process a launcher starts must not outlive it, even when the launcher is killed with SIGKILL
// (which it cannot catch): the tether that spawnTethered loads stops it.
import { spawn } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { tetheredNodeOptions } from './children';
import { isSameProcess, processStartTime } from './processes';

/** A parent that starts one child (tethered or not) holding a server open, and prints its pid. */
const PARENT = `
const { spawn } = require('node:child_process');
const child = spawn(process.execPath, ['-e', "require('node:net').createServer().listen(0, '127.0.0.1')"], {
	stdio: 'ignore',
	env: { ...process.env, NODE_OPTIONS: process.env.CHILD_NODE_OPTIONS ?? '' }
});
console.log(child.pid);
setInterval(() => {}, 1000);
`;

async function parentWithChild(childNodeOptions: string | undefined) {
	const env = { ...process.env, NODE_OPTIONS: '' };
	if (childNodeOptions !== undefined) env.CHILD_NODE_OPTIONS = childNodeOptions;
	else delete env.CHILD_NODE_OPTIONS;
	const parent = spawn(process.execPath, ['-e', PARENT], {
		env,
		stdio: ['ignore', 'pipe', 'inherit']
	});
	const childPid = await new Promise<number>((resolve) =>
		parent.stdout.once('data', (chunk) => resolve(Number(String(chunk).trim())))
	);
	// Give the child time to start (and load the tether) before its parent dies.
	await new Promise((r) => setTimeout(r, 800));
	const startTime = processStartTime(childPid);
	expect(startTime).not.toBeNull();
	return { parent, childPid, startTime: startTime as number };
}

async function aliveAfter(pid: number, startTime: number, ms: number): Promise<boolean> {
	const deadline = Date.now() + ms;
	while (Date.now() < deadline) {
		if (!isSameProcess(pid, startTime)) return false;
		await new Promise((r) => setTimeout(r, 100));
	}
	return isSameProcess(pid, startTime);
}

describe('tethered children', () => {
	it('stop within seconds when their launcher is killed with SIGKILL', async () => {
		const { parent, childPid, startTime } = await parentWithChild(tetheredNodeOptions(''));
		parent.kill('SIGKILL');
		expect(await aliveAfter(childPid, startTime, 4_000)).toBe(false);
	});

	it('without the tether, live on after it (what the tether is for)', async () => {
		const { parent, childPid, startTime } = await parentWithChild(undefined);
		parent.kill('SIGKILL');
		try {
			expect(await aliveAfter(childPid, startTime, 1_500)).toBe(true);
		} finally {
			process.kill(childPid, 'SIGKILL');
		}
	});

	it('keep running while their launcher lives', async () => {
		const { parent, childPid, startTime } = await parentWithChild(tetheredNodeOptions(''));
		try {
			expect(await aliveAfter(childPid, startTime, 1_500)).toBe(true);
		} finally {
			parent.kill('SIGKILL');
		}
		expect(await aliveAfter(childPid, startTime, 4_000)).toBe(false);
	});
});
