// A staff member's calendar subscription: public by design (calendar programs cannot sign in),
// guarded by the 160-bit token in the address; an unknown or replaced token is a plain 404.
import { error } from '@sveltejs/kit';
import { calendarFeed } from '$lib/server/care/calendar';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ params }) => {
	const body = await calendarFeed(params.token);
	if (body === null) error(404, 'There is no such calendar.');
	return new Response(body, {
		headers: {
			'content-type': 'text/calendar; charset=utf-8',
			'content-disposition': 'inline; filename="rillstone.ics"',
			'cache-control': 'no-store',
			'referrer-policy': 'no-referrer'
		}
	});
};
