import { z } from 'zod';
import { requireRole } from '$lib/server/auth/access';
import { findProperties } from '$lib/server/care/features';
import { listPlans } from '$lib/server/care/plans';
import type { PageServerLoad } from './$types';

const querySchema = z.string().trim().max(100).catch('');

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'owner', 'sales');
	const q = querySchema.parse(event.url.searchParams.get('q') ?? '');
	const [plans, properties] = await Promise.all([listPlans(), findProperties(q)]);
	return { plans, properties, q, isOwner: user.role === 'owner' };
};
