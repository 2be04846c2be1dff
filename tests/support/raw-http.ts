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
