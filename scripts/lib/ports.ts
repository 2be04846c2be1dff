import { createConnection } from 'node:net';

/** True when something already accepts connections on 127.0.0.1:port. */
export function portInUse(port: number, host = '127.0.0.1'): Promise<boolean> {
	return new Promise((resolve) => {
		const socket = createConnection({ port, host });
		socket.once('connect', () => {
			socket.destroy();
			resolve(true);
		});
		socket.once('error', () => resolve(false));
	});
}

export async function waitForPort(
	port: number,
	timeoutMs = 30_000,
	host = '127.0.0.1'
): Promise<void> {
	const deadline = Date.now() + timeoutMs;
	while (Date.now() < deadline) {
		if (await portInUse(port, host)) return;
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error(`nothing answered on ${host}:${port} within ${timeoutMs} ms`);
}
