import { z } from 'zod';
import { requireRole } from '$lib/server/auth/access';
import { estimateStatusEnum } from '$lib/server/platform/db/schema';
import { listEstimates } from '$lib/server/estimates/records';
import type { PageServerLoad } from './$types';

// An unknown status in the address lists every estimate rather than none.
const statusSchema = z.enum(estimateStatusEnum.enumValues).nullable().catch(null);

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'owner', 'sales');
	const status = statusSchema.parse(event.url.searchParams.get('status'));
	const rows = await listEstimates();
	return { rows: status ? rows.filter((r) => r.status === status) : rows, status };
};
