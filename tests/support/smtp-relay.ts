import { connect, createServer, type Server, type Socket } from 'node:net';

/**
 * A relay in front of the SMTP stand-in that a test can switch off, to stand for an SMTP outage.
 * `start()` points SMTP_PORT at the relay (read by the mail transport when it is first made).
 */
export function smtpRelay() {
	const realPort = Number(process.env.SMTP_PORT ?? 1035);
	const sockets = new Set<Socket>();
	let server: Server | null = null;
	const relay = {
		down: false,
		async start() {
			server = createServer((client) => {
				if (relay.down) return client.destroy();
				const upstream = connect(realPort, '127.0.0.1');
				sockets.add(client).add(upstream);
				client.pipe(upstream).pipe(client);
				const close = () => (client.destroy(), upstream.destroy());
				client.on('error', close).on('close', close);
				upstream.on('error', close).on('close', close);
			});
			await new Promise<void>((r) => server!.listen(0, '127.0.0.1', r));
			const address = server.address();
			process.env.SMTP_PORT = String(typeof address === 'object' && address ? address.port : 0);
		},
		stop() {
			for (const s of sockets) s.destroy();
			server?.close();
			process.env.SMTP_PORT = String(realPort);
		}
	};
	return relay;
}
