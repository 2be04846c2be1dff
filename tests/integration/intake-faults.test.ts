// Faults under the intake, each made by stopping and starting a real stand-in: S3 (an s3rver of
// this file's own), PostgreSQL (the test cluster) and SMTP (a maildev of this file's own).
import { mkdtempSync } from 'node:fs';
import { createServer, type AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3';
import { count, eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { startMail, startS3, type StandIn } from '../../scripts/lib/standins';
import { startCluster, stopCluster } from '../../scripts/lib/postgres';
import { db } from '$lib/server/platform/db';
import { leads, outbox, photos, settings, contacts } from '$lib/server/platform/db/schema';
import { DATABASE_DOWN, STORAGE_DOWN } from '$lib/server/leads/intake/errors';
import { formStamp } from '$lib/server/leads/intake/stamp';
import { receiveInquiry } from '$lib/server/leads/intake/form';
import { uploadDraft } from '$lib/server/leads/intake/drafts';
import { deliverOutboxMessage } from '$lib/server/platform/outbox';
import { createUser } from '$lib/server/auth/team';
import { resetDatabase } from '../support/database';
import { yardJpeg } from '../fixtures/images/make';

// Ports of this file's own stand-ins: free ones the system hands out (others run tests beside us).
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
const [s3Port, smtpPort, mailWebPort] = [await freePort(), await freePort(), await freePort()];
const bucket = 'rillstone-private';
const dataDir = mkdtempSync(join(tmpdir(), 'rillstone-intake-faults-'));

let s3: StandIn | null = null;
let mail: StandIn | null = null;
const startOwnS3 = async () => (s3 = await startS3({ port: s3Port, dataDir, bucket }));
const startOwnMail = async () => (mail = await startMail({ smtpPort, webPort: mailWebPort }));

const lister = new S3Client({
	endpoint: `http://127.0.0.1:${s3Port}`,
	region: 'us-east-1',
	credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
	forcePathStyle: true
});
const objects = async () =>
	(await lister.send(new ListObjectsV2Command({ Bucket: bucket, Prefix: 'intake/' }))).KeyCount ??
	0;
const n = async (table: typeof leads | typeof photos | typeof contacts | typeof outbox) =>
	(await db.select({ n: count() }).from(table))[0].n;

beforeAll(async () => {
	// The storage client and the mail transport read these when first used.
	process.env.S3_ENDPOINT = `http://127.0.0.1:${s3Port}`;
	process.env.SMTP_PORT = String(smtpPort);
	await startOwnS3();
});
afterAll(async () => {
	await s3?.stop();
	await mail?.stop();
});

beforeEach(async () => {
	await resetDatabase();
	await db.insert(settings).values({
		id: 1,
		firmName: 'Test Firm',
		email: 'office@test.example',
		phone: '(555) 010-0000'
	});
	await createUser({
		email: 'owner@test.example',
		name: 'Olive Owner',
		role: 'owner',
		password: 'correct horse battery'
	});
});

function form() {
	const data = new FormData();
	const fields: [string, string][] = [
		['name', 'Wren Haldane'],
		['email', 'wren@example.test'],
		['street', '9 Quarry Lane'],
		['town', 'Cinder Bluff'],
		['services', 'pond'],
		['services', 'planting'],
		['budget', 'unsure'],
		['timeframe', 'next-season'],
		['message', 'A small pond the birds can use.'],
		['consent', 'yes'],
		['startedAt', formStamp(Date.now() - 30_000)]
	];
	for (const [k, v] of fields) data.append(k, v);
	return data;
}
async function withPhoto() {
	const data = form();
	data.append(
		'photos',
		new File([new Uint8Array(await yardJpeg())], 'pond-spot.jpg', { type: 'image/jpeg' })
	);
	return data;
}

describe('S3 stand-in down', () => {
	it('brings the form back with every value kept and saves nothing; works once S3 is back', async () => {
		const before = await objects();
		await s3!.stop();
		s3 = null;
		try {
			const result = await receiveInquiry(await withPhoto());
			expect(result.ok).toBe(false);
			if (result.ok) return;
			expect(result.status).toBe(503);
			expect(result.message).toBe(STORAGE_DOWN);
			expect(result.values).toMatchObject({
				name: 'Wren Haldane',
				email: 'wren@example.test',
				town: 'Cinder Bluff',
				message: 'A small pond the birds can use.'
			});
			expect(result.values.services).toEqual(['pond', 'planting']);
			const upload = await uploadDraft(new File([new Uint8Array(await yardJpeg())], 'x.jpg'));
			expect(upload).toMatchObject({ ok: false, status: 503 });
			expect([await n(leads), await n(photos), await n(contacts), await n(outbox)]).toEqual([
				0, 0, 0, 0
			]);
		} finally {
			await startOwnS3();
		}
		expect(await objects()).toBe(before);
		const again = await receiveInquiry(await withPhoto());
		expect(again.ok).toBe(true);
		expect(await objects()).toBe(before + 2);
	});
});

describe('SMTP stand-in down', () => {
	it('saves the lead; the mails fail while SMTP is away and go out once it is back', async () => {
		expect(mail).toBeNull(); // nothing listens on the SMTP port yet
		const result = await receiveInquiry(form());
		expect(result.ok).toBe(true);
		if (!result.ok) return;
		expect(await n(leads)).toBe(1);
		const queued = await db.select().from(outbox).where(eq(outbox.leadId, result.leadId));
		expect(queued).toHaveLength(2);
		// Each message was handed to the queue with retries and backoff.
		const jobs = await db.execute<{ retry_limit: number; retry_backoff: boolean }>(
			sql`select retry_limit, retry_backoff from pgboss.job where name = 'mail.send' and data->>'outboxId' in (${sql.join(
				queued.map((q) => sql`${q.id}`),
				sql`, `
			)})`
		);
		expect(jobs.length).toBe(2);
		expect(jobs.every((j) => j.retry_limit >= 3 && j.retry_backoff)).toBe(true);

		for (const m of queued) await expect(deliverOutboxMessage(m.id)).rejects.toThrow();
		const failed = await db.select().from(outbox).where(eq(outbox.leadId, result.leadId));
		expect(failed.every((m) => m.sentAt === null && m.attempts === 1 && m.lastError)).toBe(true);

		await startOwnMail();
		for (const m of queued) expect(await deliverOutboxMessage(m.id)).toBe('sent');
		for (const m of queued) expect(await deliverOutboxMessage(m.id)).toBe('already-sent');
		const caught: { subject: string; to: { address: string }[] }[] = await (
			await fetch(`http://127.0.0.1:${mailWebPort}/api/email`)
		).json();
		expect(caught.map((m) => m.to[0].address).sort()).toEqual([
			'owner@test.example',
			'wren@example.test'
		]);
		expect(caught.every((m) => m.subject.includes('R-1001'))).toBe(true);
	});
});

describe('PostgreSQL down', () => {
	const pgData = process.env.TEST_PG_DATA ?? '';
	const pgPort = Number(process.env.TEST_PG_PORT);

	it('brings the form back with every value kept and leaves nothing half-saved', async () => {
		expect(pgData, 'run through npm test, which starts the test cluster').not.toBe('');
		const before = await objects();
		stopCluster(pgData);
		try {
			const result = await receiveInquiry(await withPhoto());
			expect(result.ok).toBe(false);
			if (result.ok) return;
			expect(result.status).toBe(503);
			expect(result.message).toBe(DATABASE_DOWN);
			expect(result.values).toMatchObject({
				name: 'Wren Haldane',
				email: 'wren@example.test',
				street: '9 Quarry Lane'
			});
			const upload = await uploadDraft(new File([new Uint8Array(await yardJpeg())], 'x.jpg'));
			expect(upload).toMatchObject({ ok: false, status: 503, message: DATABASE_DOWN });
			// The photos stored before the records failed were deleted again.
			expect(await objects()).toBe(before);
		} finally {
			startCluster({ dataDir: pgData, port: pgPort, database: 'unused' });
		}
		await expect
			.poll(
				async () =>
					db.execute(sql`select 1`).then(
						() => true,
						() => false
					),
				{ timeout: 20_000 }
			)
			.toBe(true);
		expect([await n(leads), await n(photos), await n(contacts), await n(outbox)]).toEqual([
			0, 0, 0, 0
		]);
		expect((await receiveInquiry(await withPhoto())).ok).toBe(true);
	});
});
