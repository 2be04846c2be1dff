import { createReadStream, createWriteStream } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import type { Handle } from '@sveltejs/kit';
import { bodyLimitFor, SPOOL_ABOVE, type BodyLimit } from '../http/body-limits';
import { requestPath } from '../http/request-path';
import { refusal } from './refusal';

/** How long the rest of a refused body is read and dropped, so the client can read the 413. */
const DRAIN_MS = 15_000;

function tooLarge(event: Parameters<Handle>[0]['event'], limit: BodyLimit): Response {
	// The connection stays open while the rest of the body is drained (drain below): closing it
	// at once would reset a client that is still sending before it could read this answer.
	if (event.request.headers.get('x-sveltekit-action') === 'true') {
		// A form posted with use:enhance reads an action result, not a page.
		return Response.json(
			{ type: 'error', status: 413, error: { message: limit.message } },
			{ status: 413 }
		);
	}
	return refusal(event.url.pathname, 413, limit.message);
}

/** Reads and drops what is left of a refused body for a while, then gives up on it. */
function drain(reader: ReadableStreamDefaultReader<Uint8Array>): void {
	const stop = setTimeout(() => void reader.cancel().catch(() => {}), DRAIN_MS);
	void (async () => {
		try {
			while (!(await reader.read()).done);
		} catch {
			// the client went away, or the server's own size limit ended the stream
		} finally {
			clearTimeout(stop);
		}
	})();
}

/** Waits for `event`, or for the stream to close (an error closes it too); leaves no listener. */
function settled(stream: ReturnType<typeof createWriteStream>, event: 'drain' | 'finish') {
	return new Promise<void>((resolve) => {
		const done = () => {
			stream.off(event, done);
			stream.off('close', done);
			resolve();
		};
		stream.once(event, done);
		stream.once('close', done);
	});
}

type Counted =
	{ ok: true; body: BodyInit; size: number; cleanup: () => Promise<void> } | { ok: false };

/** Counts a body as it streams: in memory for small limits, through a temp file for large ones. */
async function countBody(body: ReadableStream<Uint8Array>, limit: number): Promise<Counted> {
	const reader = body.getReader();
	const spool = limit > SPOOL_ABOVE;
	const chunks: Uint8Array[] = [];
	let dir: string | null = null;
	let file: ReturnType<typeof createWriteStream> | null = null;
	let size = 0;
	let fileError: Error | null = null;
	const discard = async () => {
		file?.destroy();
		if (dir) await rm(dir, { recursive: true, force: true });
	};
	try {
		if (spool) {
			dir = await mkdtemp(join(tmpdir(), 'rillstone-body-'));
			file = createWriteStream(join(dir, 'body'));
			// A write that fails (a full disk) fails the request below; one cut short by
			// discard() is expected. Without a listener either would crash the process.
			file.on('error', (error) => (fileError ??= error));
		}
		for (;;) {
			const { done, value } = await reader.read();
			if (done) break;
			size += value.byteLength;
			if (size > limit) {
				await discard();
				drain(reader);
				return { ok: false };
			}
			if (file) {
				if (!file.write(value)) await settled(file, 'drain');
				if (fileError) throw fileError;
			} else chunks.push(value);
		}
	} catch (error) {
		await discard();
		void reader.cancel().catch(() => {});
		throw error;
	}
	if (file && dir) {
		file.end();
		await settled(file, 'finish');
		if (fileError) {
			await discard();
			throw fileError;
		}
		const path = join(dir, 'body');
		const folder = dir;
		const source = createReadStream(path);
		// A route that never reads the body (a redirect, a refusal) leaves the stream open:
		// destroyed here, its file descriptor is closed, not left for the process to run out of.
		source.on('error', () => {});
		return {
			ok: true,
			size,
			body: Readable.toWeb(source) as ReadableStream<Uint8Array>,
			cleanup: async () => {
				source.destroy();
				await rm(folder, { recursive: true, force: true });
			}
		};
	}
	return { ok: true, size, body: Buffer.concat(chunks), cleanup: async () => {} };
}

/**
 * Holds every request body to its route's limit (body-limits.ts) whether it declares its length
 * or is sent in chunks, and answers 413 with the route's own message either way.
 */
export const handleBody: Handle = async ({ event, resolve }) => {
	const { request } = event;
	if (!request.body) return resolve(event);
	const limit = bodyLimitFor(requestPath(event.url.pathname) ?? event.url.pathname);
	const declared = request.headers.get('content-length');
	if (declared !== null) {
		// A declared length is enforced by the server too (more bytes than declared end the stream).
		if (Number(declared) > limit.bytes) {
			// Read and drop what comes, as for a chunked body: a connection left with unread bytes
			// would take them for the start of its next request.
			drain(request.body.getReader());
			return tooLarge(event, limit);
		}
		return resolve(event);
	}
	const counted = await countBody(request.body, limit.bytes);
	if (!counted.ok) return tooLarge(event, limit);
	const headers = new Headers(request.headers);
	headers.set('content-length', String(counted.size));
	headers.delete('transfer-encoding');
	event.request = new Request(request.url, {
		method: request.method,
		headers,
		body: counted.body,
		signal: request.signal,
		// @ts-expect-error -- Node's fetch needs this for a streamed body; the DOM types lack it
		duplex: 'half'
	});
	try {
		return await resolve(event);
	} finally {
		await counted.cleanup();
	}
};
