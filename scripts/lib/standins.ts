// eslint-disable-next-line @typescript-eslint/triple-slash-reference -- s3rver ships no types; this brings ours into every program that imports the stand-ins
/// <reference path="../types/s3rver.d.ts" />
// The local stand-ins for hosted services: s3rver for S3 and maildev for SMTP.
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import S3rver from 's3rver';
import { MailDev } from 'maildev';

export interface StandIn {
	name: string;
	stop(): Promise<void>;
}

export async function startS3(opts: {
	port: number;
	dataDir: string;
	bucket: string;
}): Promise<StandIn> {
	const directory = join(opts.dataDir, 's3');
	mkdirSync(directory, { recursive: true });
	const server = new S3rver({
		port: opts.port,
		address: '127.0.0.1',
		directory,
		silent: true,
		configureBuckets: [{ name: opts.bucket, configs: [] }]
	});
	await server.run();
	return { name: 's3', stop: () => server.close() };
}

/**
 * maildev keeps each message as a file. Without a folder of ours it uses one shared
 * `<tmp>/maildev` for every process on the machine, so two runs at once (or one run's stop)
 * remove each other's files. The dev profile keeps mail in its data folder; any other start
 * gets a fresh folder of its own, removed when it stops.
 */
export async function startMail(opts: {
	smtpPort: number;
	webPort: number;
	dataDir?: string;
}): Promise<StandIn> {
	const ownFolder = opts.dataDir ? null : mkdtempSync(join(tmpdir(), 'rillstone-mail-'));
	const mailDirectory = opts.dataDir ? join(opts.dataDir, 'mail') : (ownFolder as string);
	mkdirSync(mailDirectory, { recursive: true });
	const maildev = new MailDev({
		smtp: opts.smtpPort,
		ip: '127.0.0.1',
		web: opts.webPort,
		webIp: '127.0.0.1',
		silent: true,
		mailDirectory
	});
	await maildev.start();
	return {
		name: 'mail',
		stop: async () => {
			await maildev.stop();
			if (ownFolder) rmSync(ownFolder, { recursive: true, force: true });
		}
	};
}

/**
 * Loopback-only control used by `npm test` so the fault tests can stop and start a stand-in
 * under the running app: `POST /<name>/stop` and `POST /<name>/start`. Listens on a free port
 * of 127.0.0.1; the test runner hands its address to the tests in TEST_STANDIN_CONTROL.
 */
export async function startStandInControl(
	standIns: Record<string, { stop(): Promise<void>; start(): Promise<void> }>
): Promise<{ url: string; stop(): Promise<void> }> {
	const { createServer } = await import('node:http');
	const server = createServer((req, res) => {
		const [, name, verb] = (req.url ?? '').split('/');
		const target = standIns[name];
		if (req.method !== 'POST' || !target || (verb !== 'stop' && verb !== 'start')) {
			res.writeHead(404).end();
			return;
		}
		target[verb]().then(
			() => res.writeHead(204).end(),
			(error: Error) => res.writeHead(500, { 'content-type': 'text/plain' }).end(error.message)
		);
	});
	await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
	const address = server.address();
	const port = typeof address === 'object' && address ? address.port : 0;
	return {
		url: `http://127.0.0.1:${port}`,
		stop: () => new Promise<void>((resolve) => server.close(() => resolve()))
	};
}
