import { error, fail } from '@sveltejs/kit';
import { fieldErrors, formValues } from '$lib/schema/auth';
import { visitNotesSchema } from '$lib/schema/visits';
import { requireRole } from '$lib/server/access';
import { saveNotes, visitDetail } from '$lib/server/visits';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'owner', 'sales');
	const detail = await visitDetail(event.params.id);
	if (!detail) error(404, 'No such visit');
	if (
		user.role === 'sales' &&
		detail.visit.salespersonId !== user.id &&
		detail.visit.status !== 'booked'
	) {
		error(403, 'This visit is not yours');
	}
	return {
		visit: detail.visit,
		leadNumber: detail.leadNumber,
		homeowner: detail.homeowner,
		address: detail.address,
		salesperson: detail.salesperson.name,
		lead: detail.lead,
		photoCount: detail.photos.length
	};
};

export const actions: Actions = {
	notes: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const data = await event.request.formData();
		const parsed = visitNotesSchema.safeParse(Object.fromEntries(data));
		if (!parsed.success) {
			return fail(400, { values: formValues(data), errors: fieldErrors(parsed.error) });
		}
		if (!(await saveNotes(event.params.id, parsed.data, user.id))) error(404, 'No such visit');
		return { saved: true };
	}
};
