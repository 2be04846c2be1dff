// Private object storage (S3, or s3rver locally). Keys are random; nothing here is public.
// The client is made on first use and again whenever the endpoint setting changes, so tests
// (and a process that reloads its settings) reach the storage they point at.
import { randomBytes } from 'node:crypto';
import {
	DeleteObjectCommand,
	GetObjectCommand,
	PutObjectCommand,
	S3Client
} from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import { env } from './env';

let client: S3Client | null = null;
let clientFor = '';

function settings() {
	return {
		endpoint: env.S3_ENDPOINT ?? 'http://127.0.0.1:4569',
		region: env.S3_REGION ?? 'us-east-1',
		accessKeyId: env.S3_ACCESS_KEY_ID ?? 'S3RVER',
		secretAccessKey: env.S3_SECRET_ACCESS_KEY ?? 'S3RVER'
	};
}

export function bucket(): string {
	return env.S3_BUCKET ?? 'rillstone-private';
}

function s3(): S3Client {
	const s = settings();
	const key = JSON.stringify(s);
	if (!client || clientFor !== key) {
		client?.destroy();
		client = new S3Client({
			endpoint: s.endpoint,
			region: s.region,
			credentials: { accessKeyId: s.accessKeyId, secretAccessKey: s.secretAccessKey },
			forcePathStyle: true,
			requestChecksumCalculation: 'WHEN_REQUIRED',
			responseChecksumValidation: 'WHEN_REQUIRED',
			maxAttempts: 2
		});
		clientFor = key;
	}
	return client;
}

/** A fresh, unguessable object key under a prefix, e.g. `intake/3f…/display.webp`. */
export function randomKey(prefix: string, name: string): string {
	return `${prefix}/${randomBytes(16).toString('hex')}/${name}`;
}

export class StorageUnavailableError extends Error {
	constructor(cause: unknown) {
		super('Photo storage is out of reach', { cause });
		this.name = 'StorageUnavailableError';
	}
}

export async function putObject(key: string, body: Buffer, contentType: string): Promise<void> {
	try {
		await s3().send(
			new PutObjectCommand({
				Bucket: bucket(),
				Key: key,
				Body: body,
				ContentType: contentType,
				ContentLength: body.byteLength
			})
		);
	} catch (error) {
		throw new StorageUnavailableError(error);
	}
}

export async function getObject(key: string): Promise<Buffer> {
	const res = await s3().send(new GetObjectCommand({ Bucket: bucket(), Key: key }));
	return Buffer.from(await res.Body!.transformToByteArray());
}

/** Deletes objects; a key that is already gone is not an error (S3 answers 204 either way). */
export async function deleteObjects(keys: string[]): Promise<void> {
	// One request per key: DeleteObjects needs a Content-MD5 that s3rver and newer SDKs disagree on.
	for (const Key of keys) {
		await s3().send(new DeleteObjectCommand({ Bucket: bucket(), Key }));
	}
}

/** A short-lived link for staff to view a private object (the leads pages use it). */
export async function signedUrl(key: string, seconds = 300): Promise<string> {
	return getSignedUrl(s3(), new GetObjectCommand({ Bucket: bucket(), Key: key }), {
		expiresIn: seconds
	});
}
