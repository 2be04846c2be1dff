// A homeowner's lead written straight into the database, as if the site visit were booked and
// the estimate not yet begun: what the builder tests start from. The intake tests cover how a
// lead is really made.
import { randomBytes } from 'node:crypto';
import type { Sql } from 'postgres';

export interface LeadSpec {
	/** The contact's name; a random tag is added so runs never collide. */
	name: string;
	message: string;
	/** What the homeowner asked for (the builder's starting feature follows it). */
	services?: string[];
	/** Whose lead it is (a salesperson's user id). */
	assigneeId: string;
}

export async function seedLead(sql: Sql, spec: LeadSpec) {
	const tag = randomBytes(4).toString('hex');
	const email = `${spec.name.toLowerCase().split(' ')[0]}-${tag}@homeowner.example`;
	const name = `${spec.name} ${tag}`;
	await sql`insert into contacts (id, name, email) values (${'c-' + tag}, ${name}, ${email})`;
	await sql`insert into leads (id, contact_id, stage, message, services, assignee_id)
		values (${'l-' + tag}, ${'c-' + tag}, 'visit_booked', ${spec.message},
			${sql.array(spec.services ?? [])}, ${spec.assigneeId})`;
	return { id: 'l-' + tag, email, name };
}
