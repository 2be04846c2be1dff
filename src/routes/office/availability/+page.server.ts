import { error, fail } from '@sveltejs/kit';
import { formValues } from '$lib/schema/auth';
import { availabilitySchema, timeOffSchema } from '$lib/schema/visits';
import { requireRole } from '$lib/server/auth/access';
import type { SessionUser } from '$lib/server/auth/sessions';
import {
	addTimeOff,
	listTimeOff,
	removeTimeOff,
	rulesFor,
	salespeople,
	saveAvailability
} from '$lib/server/visits/availability';
import { hoursFromForm, overlapErrors } from './hours';
import type { Actions, PageServerLoad, RequestEvent } from './$types';
import { parseForm } from '$lib/server/platform/forms';

/**
 * Whose availability this request may touch: the owner any salesperson's (or their own), a
 * salesperson only their own, whatever the form or the address says.
 */
async function subjectOf(event: RequestEvent | Parameters<PageServerLoad>[0], user: SessionUser) {
	const asked = event.url.searchParams.get('person') || user.id;
	if (user.role !== 'owner' && asked !== user.id) error(403, 'You may change only your own hours');
	const people = await salespeople();
	const person = people.find((p) => p.id === asked);
	if (!person) error(404, 'No such salesperson');
	return { person, people };
}

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'owner', 'sales');
	const { person, people } = await subjectOf(event, user);
	const [rules, off] = await Promise.all([rulesFor(person.id), listTimeOff(person.id)]);
	return {
		person,
		people: user.role === 'owner' ? people : [person],
		rules,
		timeOff: off.map((t) => ({
			id: t.id,
			startsAt: t.startsAt,
			endsAt: t.endsAt,
			reason: t.reason
		}))
	};
};

export const actions: Actions = {
	rules: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const { person } = await subjectOf(event, user);
		const data = await event.request.formData();
		const { hours, row } = hoursFromForm(data);
		const parsed = await parseForm(data, availabilitySchema, {
			read: (form) => ({ ...Object.fromEntries(form), weeklyHours: hours })
		});
		const errors = parsed.ok ? overlapErrors(parsed.data.weeklyHours) : parsed.failure.data.errors;
		if (!parsed.ok || Object.keys(errors).length) {
			const onRows: Record<string, string> = {};
			for (const [k, v] of Object.entries(errors)) {
				// A message with no field of its own (none expected) still shows, above the form.
				const key = /^(weeklyHours\.\d\.\d\.(start|end)|[a-zA-Z]+)$/.test(row(k))
					? row(k)
					: '_form';
				onRows[key] ??= v;
			}
			return fail(400, { form: 'rules', values: formValues(data), errors: onRows });
		}
		await saveAvailability(person.id, parsed.data, user.id);
		return { form: 'rules', saved: `Saved the hours and rules of ${person.name}.` };
	},
	addTimeOff: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const { person } = await subjectOf(event, user);
		const data = await event.request.formData();
		// An empty field is one left out (the schema's optional times and reason).
		const parsed = await parseForm(data, timeOffSchema, {
			extra: { form: 'timeOff' },
			read: (form) => Object.fromEntries([...form].filter(([, v]) => v !== ''))
		});
		if (!parsed.ok) return parsed.failure;
		await addTimeOff(person.id, parsed.data);
		return { form: 'timeOff', saved: 'Time off added.' };
	},
	removeTimeOff: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const { person } = await subjectOf(event, user);
		const id = String((await event.request.formData()).get('id') ?? '');
		if (!id) {
			return fail(400, { form: 'timeOff', errors: { _form: 'Pick the time off to remove' } });
		}
		await removeTimeOff(person.id, id);
		return { form: 'timeOff', saved: 'Time off removed.' };
	}
};
