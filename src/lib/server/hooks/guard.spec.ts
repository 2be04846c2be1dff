import { describe, expect, it, vi } from 'vitest';
import { handleGuard } from './guard';

/** Runs the guard for a signed-in user of `role` on `path`; tells whether the page was reached. */
async function reaches(role: 'owner' | 'sales' | 'crew', path: string) {
	const resolve = vi.fn(async () => new Response('page'));
	const event = {
		url: new URL(`http://app.test${path}`),
		locals: { user: { id: 'u1', role, name: 'Test', email: 't@test.example' } }
	};
	const res = await handleGuard({ event, resolve } as never);
	return { reached: resolve.mock.calls.length > 0, status: res.status };
}

describe('the guard judges the path the router matches', () => {
	it('lets crew reach the jobs board and keeps them off owner pages', async () => {
		expect(await reaches('crew', '/office/jobs')).toEqual({ reached: true, status: 200 });
		expect((await reaches('crew', '/office/team')).reached).toBe(false);
		expect((await reaches('crew', '/office/payments/x')).reached).toBe(false);
	});

	it('no encoded variant of an owner-only path reaches the page for crew', async () => {
		for (const path of [
			'/office/%74eam',
			'/office/%74%65%61%6D/',
			'//office//team',
			'/office/jobs/../team',
			'/office/jobs/%2e%2e/team',
			// An encoded "/" is one character of a segment to the router (/office/payments/[id]),
			// never a separator: these must not be judged as the jobs board.
			'/office/payments/x%2F..%2F..%2Fjobs',
			'/office/payments/x%2f..%2f..%2fjobs',
			'/office/payments/x%5C..%5C..%5Cjobs',
			'/office/payments%2F..%2Fjobs'
		]) {
			expect((await reaches('crew', path)).reached, path).toBe(false);
		}
	});
});
