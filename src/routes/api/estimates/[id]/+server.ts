import { error, json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/auth/access';
import { getEstimate } from '$lib/server/estimates/records';
import { saveEstimate } from '$lib/server/estimates/versions';
import { saveEstimateSchema } from '$lib/schema/estimates';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async (event) => {
	requireRole(event, 'owner', 'sales');
	const row = await getEstimate(event.params.id);
	if (!row) error(404, 'No such estimate');
	return json({
		id: row.id,
		number: row.number,
		status: row.status,
		revision: row.revision,
		design: row.design,
		overrides: row.overrides,
		scope: row.scope,
		totalCents: row.totalCents,
		depositCents: row.depositCents
	});
};

/** Autosave: the body carries the revision the builder last saw; a newer one answers 409. */
export const PUT: RequestHandler = async (event) => {
	const user = requireRole(event, 'owner', 'sales');
	let body: unknown;
	try {
		body = await event.request.json();
	} catch {
		error(400, 'The body is not JSON');
	}
	const parsed = saveEstimateSchema.safeParse(body);
	if (!parsed.success) {
		return json(
			{
				message: 'The estimate could not be saved',
				errors: parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }))
			},
			{ status: 400 }
		);
	}
	const out = await saveEstimate(event.params.id, parsed.data, user);
	switch (out.kind) {
		case 'missing':
			error(404, 'No such estimate');
		// eslint-disable-next-line no-fallthrough
		case 'frozen':
			return json(
				{ message: `This version is ${out.status} and can no longer change: make a new version` },
				{ status: 409 }
			);
		case 'conflict':
			return json(
				{
					message: `${out.by ?? 'Someone'} saved this estimate after you opened it`,
					by: out.by,
					at: out.at,
					revision: out.revision
				},
				{ status: 409 }
			);
		case 'saved':
			return json({
				revision: out.revision,
				errors: out.errors,
				totalCents: out.stored?.priced.pricing.totalCents ?? null
			});
	}
};
