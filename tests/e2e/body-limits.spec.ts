// Body limits hold whatever the framing: a photo, an inquiry or a form sent chunked (no
// Content-Length) is cut off at its route's limit with the same 413 and message as one that
// declares its length, and a body within the limit still arrives whole.
import { expect, test } from '@playwright/test';
import { yardJpeg } from '../fixtures/images/make';
import { streamBody } from '../support/raw-http';

const MB = 1024 * 1024;
const PHOTO = 'Each photo can be at most 15 MB.';

function multipart(field: string, filename: string, type: string) {
	const boundary = '----rillstone' + Math.random().toString(16).slice(2);
	return {
		boundary,
		head: Buffer.from(
			`--${boundary}\r\nContent-Disposition: form-data; name="${field}"; filename="${filename}"\r\nContent-Type: ${type}\r\n\r\n`
		),
		tail: Buffer.from(`\r\n--${boundary}--\r\n`)
	};
}

for (const declare of [true, false]) {
	const framing = declare ? 'with a declared length' : 'chunked, without a length';

	test(`a 40 MB photo ${framing} is refused with 413 and the photo message`, async ({
		baseURL
	}) => {
		const m = multipart('file', 'big.jpg', 'image/jpeg');
		const res = await streamBody(baseURL!, '/api/uploads', {
			bytes: 40 * MB,
			prefix: m.head,
			suffix: m.tail,
			declare,
			headers: {
				'content-type': `multipart/form-data; boundary=${m.boundary}`,
				accept: 'application/json'
			}
		});
		expect(res.status).toBe(413);
		expect(JSON.parse(res.body).message).toBe(PHOTO);
		// It stopped reading near the limit (15 MB and the form's room), not at the end.
		if (!declare) expect(res.sentBytes).toBeLessThan(40 * MB);
	});

	test(`an inquiry over 60 MB ${framing} is refused with 413 and the inquiry message`, async ({
		baseURL
	}) => {
		const m = multipart('photos', 'big.jpg', 'image/jpeg');
		const res = await streamBody(baseURL!, '/start', {
			bytes: 70 * MB,
			prefix: m.head,
			suffix: m.tail,
			declare,
			headers: { 'content-type': `multipart/form-data; boundary=${m.boundary}` }
		});
		expect(res.status).toBe(413);
		expect(res.body).toContain('at most 60 MB in all');
	});

	test(`a 2 MB sign-in form ${framing} is refused with 413 at the 1 MB limit`, async ({
		baseURL
	}) => {
		const res = await streamBody(baseURL!, '/sign-in', {
			bytes: 2 * MB,
			prefix: Buffer.from('email=a%40b.example&password='),
			declare,
			headers: { 'content-type': 'application/x-www-form-urlencoded' }
		});
		expect(res.status).toBe(413);
		expect(res.body).toContain('at most 1 MB');
	});
}

test('a real photo sent chunked is received whole and stored as a draft', async ({ baseURL }) => {
	const jpeg = await yardJpeg();
	const m = multipart('file', 'yard.jpg', 'image/jpeg');
	const prefix = Buffer.concat([m.head, jpeg]);
	const res = await streamBody(baseURL!, '/api/uploads', {
		bytes: prefix.length + m.tail.length,
		prefix,
		suffix: m.tail,
		headers: {
			'content-type': `multipart/form-data; boundary=${m.boundary}`,
			accept: 'application/json'
		}
	});
	expect(res.status, res.body).toBe(201);
	expect(JSON.parse(res.body)).toMatchObject({ width: expect.any(Number) });
});
