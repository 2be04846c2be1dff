// eslint-disable-next-line @typescript-eslint/triple-slash-reference -- s3rver ships no types; this brings ours into every program that imports the stand-ins
/// <reference path="../types/s3rver.d.ts" />
// The local stand-ins for hosted services: s3rver for S3 and maildev for SMTP.
import { mkdirSync } from 'node:fs';
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

export async function startMail(opts: {
	smtpPort: number;
	webPort: number;
	dataDir?: string;
}): Promise<StandIn> {
	const mailDirectory = opts.dataDir ? join(opts.dataDir, 'mail') : undefined;
	if (mailDirectory) mkdirSync(mailDirectory, { recursive: true });
	const maildev = new MailDev({
		smtp: opts.smtpPort,
		ip: '127.0.0.1',
		web: opts.webPort,
		webIp: '127.0.0.1',
		silent: true,
		mailDirectory
	});
	await maildev.start();
	return { name: 'mail', stop: () => maildev.stop() };
}
