import { error, fail } from '@sveltejs/kit';
import { fieldErrors, formValues } from '$lib/schema/auth';
import { bookSchema, cancelFormSchema, rescheduleFormSchema } from '$lib/schema/visits';
import { requireRole } from '$lib/server/auth/access';
import { VisitError } from '$lib/server/visits/errors';
import { bookVisit, cancelVisit, rescheduleVisit } from '$lib/server/visits/booking';
import { leadForVisit, visitsOfLead } from '$lib/server/visits/agenda';
import { salespeople } from '$lib/server/visits/availability';
import { firmToday } from '$lib/server/platform/settings';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'owner', 'sales');
	const lead = await leadForVisit(event.params.id);
	if (!lead) error(404, 'No such lead');
	const [visits, people] = await Promise.all([visitsOfLead(lead.id), salespeople()]);
	return {
		lead,
		visits,
		people,
		current: visits.find((v) => v.status === 'booked') ?? null,
		today: await firmToday(),
		defaultPerson: lead.assigneeId ?? (user.role === 'sales' ? user.id : (people[0]?.id ?? ''))
	};
};

function refused(e: unknown, data: FormData) {
	if (e instanceof VisitError && e.code === 'not_found') {
		return fail(404, { values: formValues(data), message: e.message });
	}
	if (e instanceof VisitError) {
		return fail(e.code === 'taken' ? 409 : 422, {
			values: formValues(data),
			errors: { startsAt: e.message },
			taken: e.code === 'taken'
		});
	}
	throw e;
}

export const actions: Actions = {
	book: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const data = await event.request.formData();
		const parsed = bookSchema.safeParse(Object.fromEntries(data));
		if (!parsed.success) {
			return fail(400, { values: formValues(data), errors: fieldErrors(parsed.error) });
		}
		try {
			await bookVisit({
				leadId: event.params.id,
				salespersonId: parsed.data.salespersonId,
				startsAt: new Date(parsed.data.startsAt),
				noteForHomeowner: parsed.data.noteForHomeowner,
				actorId: user.id
			});
		} catch (e) {
			return refused(e, data);
		}
		return { done: 'Visit booked. Invitations are on their way to both of you.' };
	},
	reschedule: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const data = await event.request.formData();
		const parsed = rescheduleFormSchema.safeParse(Object.fromEntries(data));
		if (!parsed.success) {
			return fail(400, { values: formValues(data), errors: fieldErrors(parsed.error) });
		}
		try {
			await rescheduleVisit(parsed.data.visitId, {
				salespersonId: parsed.data.salespersonId,
				startsAt: new Date(parsed.data.startsAt),
				noteForHomeowner: parsed.data.noteForHomeowner,
				actorId: user.id,
				leadId: event.params.id
			});
		} catch (e) {
			return refused(e, data);
		}
		return { done: 'Visit moved. Updated invitations are on their way.' };
	},
	cancel: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const data = await event.request.formData();
		const parsed = cancelFormSchema.safeParse(Object.fromEntries(data));
		if (!parsed.success) {
			return fail(400, { values: formValues(data), errors: fieldErrors(parsed.error) });
		}
		try {
			await cancelVisit(parsed.data.visitId, {
				reason: parsed.data.reason,
				actorId: user.id,
				by: 'staff',
				leadId: event.params.id
			});
		} catch (e) {
			if (e instanceof VisitError && e.code === 'closed') {
				return fail(422, { values: formValues(data), errors: { reason: e.message } });
			}
			return refused(e, data);
		}
		return { done: 'Visit cancelled. Both of you get a cancellation.' };
	}
};
