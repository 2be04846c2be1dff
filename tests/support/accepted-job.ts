// A sold job written straight into the database: an accepted estimate with a homeowner link and
// the job made from it. The journey covers how one is really made; the payment, fault, link-page
// and injection tests (e2e and integration alike) only need one to exist.
import { createHash, randomBytes } from 'node:crypto';
import type { Sql } from 'postgres';
import type { FrozenEstimate } from '../../src/lib/server/platform/db/schema';

export interface AcceptedJobSpec {
	name: string;
	email: string;
	message: string;
	scope: string;
	title: string;
	totalCents: number;
	depositCents: number;
	taxCents?: number;
	crewLeadId?: string | null;
}

const newId = () => randomBytes(12).toString('base64url');
type JsonValue = Parameters<Sql['json']>[0];

/** What the job keeps of the sale: version 1 of the estimate, accepted through its link. */
export function frozenEstimate(f: {
	estimateId: string;
	scope: string;
	typedName: string;
	totalCents: number;
	depositCents: number;
	taxCents: number;
}): FrozenEstimate {
	return {
		estimateId: f.estimateId,
		number: 1,
		revision: 1,
		scope: f.scope,
		design: {},
		result: { totals: { taxCents: f.taxCents } },
		choices: { options: [], alternates: {} },
		acceptance: {
			typedName: f.typedName,
			acceptedAt: new Date().toISOString(),
			ipAddress: null,
			userAgent: null,
			method: 'link',
			recordedBy: null
		},
		totalCents: f.totalCents,
		depositCents: f.depositCents
	};
}

/** The job's id and the estimate's link token (the pay page's /pay/[token]). */
export async function seedAcceptedJob(
	sql: Sql,
	spec: AcceptedJobSpec
): Promise<{ token: string; jobId: string }> {
	const token = randomBytes(20).toString('base64url');
	const [contactId, leadId, estimateId, jobId] = [newId(), newId(), newId(), newId()];
	const { totalCents, depositCents } = spec;
	await sql`insert into contacts (id, name, email) values (${contactId}, ${spec.name}, ${spec.email})`;
	await sql`insert into leads (id, contact_id, stage, services, message)
		values (${leadId}, ${contactId}, 'sold', ${['bubbler']}, ${spec.message})`;
	await sql`insert into estimates (id, lead_id, number, status, design, scope, total_cents, deposit_cents, token_hash, expires_at)
		values (${estimateId}, ${leadId}, 1, 'accepted', '{}'::jsonb, ${spec.scope}, ${totalCents},
			${depositCents}, ${createHash('sha256').update(token).digest('hex')}, now() + interval '30 days')`;
	const frozen = frozenEstimate({
		estimateId,
		scope: spec.scope,
		typedName: spec.name,
		totalCents,
		depositCents,
		taxCents: spec.taxCents ?? 0
	});
	await sql`insert into jobs (id, estimate_id, lead_id, contact_id, title, frozen, contract_cents, deposit_due_cents, crew_lead_id)
		values (${jobId}, ${estimateId}, ${leadId}, ${contactId}, ${spec.title}, ${sql.json(frozen as unknown as JsonValue)},
			${totalCents}, ${depositCents}, ${spec.crewLeadId ?? null})`;
	return { token, jobId };
}
