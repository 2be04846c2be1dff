// The body hook on its own: chunked bodies are counted as they stream and cut off at the route's
// limit with its message; bodies within the limit reach the route whole (through a temp file for
// the large limits); a declared length over the limit is refused before anything is read.
import { mkdtempSync, readdirSync, readlinkSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { handleBody } from '$lib/server/hooks/body';

const MB = 1024 * 1024;

/** A chunked body of `bytes` bytes; counts how much of it was pulled. */
function chunked(bytes: number, fill = 7) {
	const pulled = { bytes: 0 };
	const stream = new ReadableStream<Uint8Array>({
		pull(controller) {
			if (pulled.bytes >= bytes) return controller.close();
			const n = Math.min(64 * 1024, bytes - pulled.bytes);
			pulled.bytes += n;
			controller.enqueue(new Uint8Array(n).fill(fill));
		}
	});
	return { stream, pulled };
}

function event(
	path: string,
	body: ReadableStream<Uint8Array>,
	headers: Record<string, string> = {}
) {
	const url = new URL(`http://app.test${path}`);
	return {
		url,
		request: new Request(url, {
			method: 'POST',
			headers: { 'content-type': 'application/octet-stream', ...headers },
			body,
			// @ts-expect-error -- Node's fetch needs this for a streamed body; the DOM types lack it
			duplex: 'half'
		})
	};
}

/** What this process's file descriptors point at (Linux). */
const openFiles = () =>
	readdirSync('/proc/self/fd').map((fd) => {
		try {
			return readlinkSync(`/proc/self/fd/${fd}`);
		} catch {
			return '';
		}
	});

// Each test spools into a folder of its own (the hook follows TMPDIR through os.tmpdir()), so
// another run's uploads in the shared temp folder can't change what is counted here.
const systemTmp = process.env.TMPDIR;
beforeEach(() => {
	process.env.TMPDIR = mkdtempSync(`${tmpdir()}/rillstone-body-test-`);
});
afterEach(() => {
	rmSync(tmpdir(), { recursive: true, force: true });
	if (systemTmp === undefined) delete process.env.TMPDIR;
	else process.env.TMPDIR = systemTmp;
});

const spools = () => readdirSync(tmpdir()).filter((f) => f.startsWith('rillstone-body-')).length;

describe('request body limits', () => {
	it('cuts a chunked 40 MB photo off at the 15 MB limit with the photo message', async () => {
		const { stream, pulled } = chunked(40 * MB);
		const resolve = vi.fn();
		const res = await handleBody({ event: event('/api/uploads', stream), resolve } as never);
		expect(res.status).toBe(413);
		expect(await res.json()).toEqual({ message: 'Each photo can be at most 15 MB.' });
		expect(resolve).not.toHaveBeenCalled();
		expect(pulled.bytes).toBeLessThan(17 * MB);
		expect(spools()).toBe(0);
	});

	it('cuts a chunked 2 MB form off at the 1 MB default', async () => {
		const { stream } = chunked(2 * MB);
		const resolve = vi.fn();
		const res = await handleBody({
			event: event('/sign-in', stream, { accept: 'text/html' }),
			resolve
		} as never);
		expect(res.status).toBe(413);
		expect(await res.text()).toContain('at most 1 MB');
		expect(resolve).not.toHaveBeenCalled();
	});

	it('passes a chunked 12 MB inquiry through whole, from a temp file that is removed after', async () => {
		const { stream } = chunked(12 * MB, 9);
		let received = 0;
		let allNines = true;
		const res = await handleBody({
			event: event('/start', stream),
			resolve: async (e: { request: Request }) => {
				expect(e.request.headers.get('content-length')).toBe(String(12 * MB));
				expect(spools()).toBe(1);
				const bytes = new Uint8Array(await e.request.arrayBuffer());
				received = bytes.length;
				allNines = bytes.every((b) => b === 9);
				return new Response('ok');
			}
		} as never);
		expect(res.status).toBe(200);
		expect(received).toBe(12 * MB);
		expect(allNines).toBe(true);
		expect(spools()).toBe(0);
	});

	it('closes and removes the temp file when the route never reads the body', async () => {
		const { stream } = chunked(3 * MB);
		let spoolPath = '';
		const res = await handleBody({
			event: event('/start', stream),
			resolve: async () => {
				await new Promise((r) => setTimeout(r, 50));
				spoolPath = openFiles().find((p) => p.includes('rillstone-body-')) ?? '';
				return new Response(null, { status: 303, headers: { location: '/sign-in' } });
			}
		} as never);
		expect(res.status).toBe(303);
		expect(spools()).toBe(0);
		// The spool file was open while the route ran, and no descriptor is left on it after.
		expect(spoolPath).toContain('rillstone-body-');
		await vi.waitFor(() =>
			expect(openFiles().filter((p) => p.includes('rillstone-body-'))).toEqual([])
		);
	});

	it('answers a declared length over the limit at once, then drains the body so the connection stays usable', async () => {
		const { stream, pulled } = chunked(40 * MB);
		const resolve = vi.fn();
		const e = event('/office/price-list/import', stream, { 'content-length': String(40 * MB) });
		const res = await handleBody({ event: e, resolve } as never);
		expect(res.status).toBe(413);
		expect(pulled.bytes).toBeLessThan(1 * MB);
		expect(await res.text()).toContain('at most 5 MB');
		expect(resolve).not.toHaveBeenCalled();
		await vi.waitFor(() => expect(pulled.bytes).toBe(40 * MB), { timeout: 10_000 });
	});
});
