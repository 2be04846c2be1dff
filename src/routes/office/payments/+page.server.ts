import { requireRole } from '$lib/server/auth/access';
import { openBalances } from '$lib/server/payments/balances';
import { recentPayments } from '$lib/server/payments/ledger';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'owner');
	const balances = await openBalances();
	return {
		balances: balances.map((b) => ({
			jobId: b.jobId,
			number: b.number,
			title: b.title,
			stage: b.stage,
			contactName: b.contactName,
			dueKind: b.dueKind,
			dueCents: b.dueCents,
			balanceCents: b.money.balanceCents,
			dueOn: b.dueOn,
			daysOverdue: b.daysOverdue
		})),
		recent: await recentPayments(15)
	};
};
