// The refusals of the jobs domain, each with a code the routes turn into a status.

export type JobErrorCode =
	| 'not_found'
	| 'not_accepted'
	| 'already_converted'
	| 'forbidden'
	| 'job_paid'
	| 'open_punch_items'
	| 'bad_stage'
	| 'invalid';

export class JobError extends Error {
	constructor(
		readonly code: JobErrorCode,
		message: string,
		readonly jobId?: string
	) {
		super(message);
		this.name = 'JobError';
	}
}
