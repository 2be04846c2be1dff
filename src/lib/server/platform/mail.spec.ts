// A mail server that greets and then goes silent: the send fails after the socket timeout
// instead of hanging (and holding the outbox row's lock) for nodemailer's default ten minutes.
import { createServer, type Socket } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const sockets: Socket[] = [];
const server = createServer((socket) => {
	sockets.push(socket);
	socket.on('error', () => {});
	socket.write('220 silent.test ESMTP\r\n'); // greets, then never answers EHLO
});

beforeAll(async () => {
	await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
	const address = server.address();
	process.env.SMTP_HOST = '127.0.0.1';
	process.env.SMTP_PORT = String(typeof address === 'object' && address ? address.port : 0);
	process.env.SMTP_SOCKET_TIMEOUT_MS = '300';
});
afterAll(async () => {
	for (const s of sockets) s.destroy();
	await new Promise((r) => server.close(r));
});

describe('sending through a server that stops answering', () => {
	it('fails after the socket timeout rather than waiting for the server', async () => {
		const { sendMail } = await import('./mail');
		await expect(
			sendMail({ to: 'a@test.example', subject: 'x', text: 'x', html: '<p>x</p>' })
		).rejects.toThrow(/timeout|timed out/i);
		// Without a socket timeout this never settles within the test's own timeout.
	});
});
