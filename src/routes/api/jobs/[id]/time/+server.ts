import { error, json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/auth/access';
import { orHttp } from '$lib/server/http/domain';
import { recordTimeEntries } from '$lib/server/costing/time';
import { timeBatchSchema } from '$lib/schema/costing';
import type { RequestHandler } from './$types';

/**
 * The crew lead's phone sends its waiting time entries here. The answer lists the entries now
 * stored (including those stored by an earlier send) and those refused with the reason; the
 * phone keeps refused entries on screen and drops nothing it has not seen stored.
 */
export const POST: RequestHandler = async (event) => {
	const user = requireRole(event, 'owner', 'sales', 'crew');
	let body: unknown;
	try {
		body = await event.request.json();
	} catch {
		error(400, 'The body is not JSON');
	}
	const parsed = timeBatchSchema.safeParse(body);
	if (!parsed.success) error(400, parsed.error.issues[0].message);
	const result = await orHttp(() => recordTimeEntries(user, event.params.id, parsed.data.entries));
	return json(result);
};
