// Stops and starts the stand-ins of `npm test` under the running app, through the runner's
// loopback control (scripts/lib/standins.ts, startStandInControl).
export type StandInName = 's3' | 'mail' | 'payments';

function controlUrl(): string {
	const url = process.env.TEST_STANDIN_CONTROL;
	if (!url) throw new Error('run through npm test, which hands the stand-in control to the tests');
	return url;
}

async function call(name: StandInName, verb: 'stop' | 'start'): Promise<void> {
	const res = await fetch(`${controlUrl()}/${name}/${verb}`, { method: 'POST' });
	if (res.status !== 204) throw new Error(`${verb} ${name}: ${res.status} ${await res.text()}`);
}

export const stopStandIn = (name: StandInName) => call(name, 'stop');
export const startStandIn = (name: StandInName) => call(name, 'start');

/** Runs `during` with the stand-in stopped, and always starts it again, even when `during` fails. */
export async function withStandInDown<T>(name: StandInName, during: () => Promise<T>): Promise<T> {
	await stopStandIn(name);
	try {
		return await during();
	} finally {
		await startStandIn(name);
	}
}
