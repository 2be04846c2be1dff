import { error, fail } from '@sveltejs/kit';
import { z } from 'zod';
import { fieldErrors, formValues } from '$lib/schema/auth';
import { cancelSchema } from '$lib/schema/visits';
import {
	cancelByHomeowner,
	confirmByHomeowner,
	requestOtherTime,
	visitByToken
} from '$lib/server/visits/homeowner';
import { whenText } from '$lib/server/visits/mail';
import type { Actions, PageServerLoad } from './$types';

// The homeowner's private page: no sign-in; the token in the address is the key (stored hashed).
export const load: PageServerLoad = async ({ params }) => {
	const party = await visitByToken(params.token);
	if (!party) error(404, 'This link has expired or is not valid. Call us and we will sort it out.');
	const { visit } = party;
	return {
		firm: { name: party.firm.firmName, phone: party.firm.phone },
		when: whenText(visit),
		address: party.address,
		salesperson: party.salesperson.name,
		status: visit.status,
		cancelledBy: visit.status === 'cancelled' ? (visit.cancelledBy ?? 'staff') : null,
		confirmed: visit.confirmedAt !== null,
		changeRequested: visit.changeRequest,
		note: visit.noteForHomeowner
	};
};

const message = z.string().trim().min(3, 'Tell us which times suit you').max(1000);

export const actions: Actions = {
	confirm: async ({ params }) => {
		if (!(await confirmByHomeowner(params.token))) {
			return fail(410, { message: 'This visit can no longer be confirmed.' });
		}
		return { done: 'Thank you: the visit is confirmed.' };
	},
	other: async ({ params, request }) => {
		const data = await request.formData();
		const parsed = message.safeParse(data.get('message') ?? '');
		if (!parsed.success) {
			return fail(400, {
				error: parsed.error.issues[0].message,
				value: String(data.get('message') ?? '')
			});
		}
		if (!(await requestOtherTime(params.token, parsed.data))) {
			return fail(410, { message: 'This visit can no longer be changed.' });
		}
		return { done: 'Thank you: we will be in touch with another time.' };
	},
	cancel: async ({ params, request }) => {
		const data = await request.formData();
		const parsed = cancelSchema.safeParse({ reason: data.get('reason') ?? '' });
		if (!parsed.success) {
			return fail(400, { values: formValues(data), errors: fieldErrors(parsed.error) });
		}
		if (!(await cancelByHomeowner(params.token, parsed.data.reason))) {
			return fail(410, { message: 'This visit is already cancelled.' });
		}
		return { done: 'The visit is cancelled. Call us any time to book again.' };
	}
};
