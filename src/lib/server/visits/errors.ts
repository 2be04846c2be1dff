// The refusals of site-visit booking, each with a code the routes turn into a status.
import { REFUSALS, type Refusal } from '$lib/scheduling/slots';

export type VisitErrorCode =
	Refusal | 'not_found' | 'lead_has_visit' | 'not_salesperson' | 'closed';

export class VisitError extends Error {
	constructor(
		readonly code: VisitErrorCode,
		message: string = (REFUSALS as Record<string, string>)[code] ?? code
	) {
		super(message);
		this.name = 'VisitError';
	}
}
