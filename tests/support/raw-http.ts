// Requests sent byte for byte as written: fetch and Playwright normalise paths (dot segments,
// escapes) and refuse control characters, which is exactly what these tests must send.
import { request as httpRequest } from 'node:http';

export interface RawAnswer {
	status: number;
	headers: Record<string, string | string[] | undefined>;
	body: string;
}

export function rawRequest(
	baseURL: string,
	path: string,
	options: { method?: string; cookie?: string; headers?: Record<string, string> } = {}
): Promise<RawAnswer> {
	const base = new URL(baseURL);
	return new Promise((resolve, reject) => {
		const req = httpRequest(
			{
				host: base.hostname,
				port: base.port,
				method: options.method ?? 'GET',
				path,
				headers: {
					accept: 'text/html',
					...(options.cookie ? { cookie: options.cookie } : {}),
					...options.headers
				},
				insecureHTTPParser: false
			},
			(res) => {
				const chunks: Buffer[] = [];
				res.on('data', (c: Buffer) => chunks.push(c));
				res.on('end', () =>
					resolve({
						status: res.statusCode ?? 0,
						headers: res.headers,
						body: Buffer.concat(chunks).toString('utf8')
					})
				);
				res.on('error', reject);
			}
		);
		req.on('error', reject);
		req.end();
	});
}

/**
 * Streams a body of `bytes` bytes (a prefix, then zeros) to the app, chunked unless `declare` is
 * set, and stops sending as soon as the app answers. Resolves with the answer and how much was
 * sent before it came.
 */
export function streamBody(
	baseURL: string,
	path: string,
	options: {
		bytes: number;
		prefix?: Buffer;
		suffix?: Buffer;
		declare?: boolean;
		headers?: Record<string, string>;
	}
): Promise<RawAnswer & { sentBytes: number }> {
	const base = new URL(baseURL);
	const prefix = options.prefix ?? Buffer.alloc(0);
	const suffix = options.suffix ?? Buffer.alloc(0);
	const fill = options.bytes - prefix.length - suffix.length;
	return new Promise((resolve, reject) => {
		let sent = 0;
		let answered = false;
		const req = httpRequest({
			host: base.hostname,
			port: base.port,
			method: 'POST',
			path,
			headers: {
				origin: baseURL,
				...(options.declare ? { 'content-length': String(options.bytes) } : {}),
				...options.headers
			}
		});
		req.on('response', (res) => {
			answered = true;
			const chunks: Buffer[] = [];
			res.on('data', (c: Buffer) => chunks.push(c));
			res.on('end', () => {
				resolve({
					status: res.statusCode ?? 0,
					headers: res.headers,
					body: Buffer.concat(chunks).toString('utf8'),
					sentBytes: sent
				});
				req.destroy();
			});
		});
		// The app may close the connection after answering while bytes are still on their way.
		req.on('error', (error) => {
			if (!answered) reject(error);
		});
		const chunk = Buffer.alloc(64 * 1024);
		let left = fill;
		const pump = () => {
			if (answered) return;
			if (sent === 0 && prefix.length) {
				req.write(prefix);
				sent += prefix.length;
			}
			while (left > 0 && !answered) {
				const part = left >= chunk.length ? chunk : chunk.subarray(0, left);
				left -= part.length;
				sent += part.length;
				if (!req.write(part)) {
					req.once('drain', pump);
					return;
				}
			}
			if (left <= 0 && !answered) {
				if (suffix.length) req.write(suffix);
				sent += suffix.length;
				req.end();
			}
		};
		pump();
	});
}
