// One type for every refusal a domain module makes: a code, the message a person reads, and
// optionally the form field it is about. The HTTP status of each code is decided here, once;
// routes turn a refusal into a response with `domainAction` / `orHttp` ($lib/server/http/domain).

/** Every refusal code of every domain, with its HTTP status. */
export const STATUS_OF_CODE = {
	// shared
	not_found: 404,
	forbidden: 403,
	conflict: 409,
	invalid: 400,
	// jobs
	not_accepted: 400,
	already_converted: 400,
	job_paid: 400,
	open_punch_items: 400,
	bad_stage: 400,
	// payments
	over_balance: 400,
	over_refund: 400,
	nothing_due: 400,
	duplicate_reference: 400,
	// leads and contacts
	stale: 409,
	already_merged: 400,
	// site visits: a lost race is a conflict, every other refusal an unprocessable request
	taken: 409,
	past: 422,
	too_soon: 422,
	too_far: 422,
	outside_hours: 422,
	time_off: 422,
	lead_has_visit: 422,
	not_salesperson: 422,
	closed: 422,
	// the team
	team: 400,
	// a homeowner's decision through a link that no longer allows one
	decided: 409
} as const;

export type DomainErrorCode = keyof typeof STATUS_OF_CODE;

export class DomainError<C extends DomainErrorCode = DomainErrorCode> extends Error {
	constructor(
		readonly code: C,
		message: string,
		/** The form field the refusal is about, so the page shows it beside that field. */
		readonly field?: string
	) {
		super(message);
		this.name = new.target.name;
	}

	get status(): number {
		return STATUS_OF_CODE[this.code];
	}
}
