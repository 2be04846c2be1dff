import {
	callbackHoursSchema,
	closeCallbackSchema,
	scheduleCallbackSchema
} from '$lib/schema/callbacks';
import { requireRole } from '$lib/server/auth/access';
import { domainAction as jobAction, orHttp } from '$lib/server/http/domain';
import { crewLeads } from '$lib/server/jobs/read';
import { photoLinks } from '$lib/server/photos/links';
import { firmToday } from '$lib/server/platform/settings';
import { newToken } from '$lib/server/platform/crypto';
import {
	callbackFor,
	callbackView,
	closeCallback,
	logCallbackHours,
	scheduleCallback
} from '$lib/server/callbacks/callbacks';
import type { Actions, PageServerLoad } from './$types';
import { parseForm } from '$lib/server/platform/forms';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'owner', 'sales', 'crew');
	const view = await orHttp(() => callbackView(user, event.params.id));
	const [photos, crew, today] = await Promise.all([
		photoLinks(view.photos),
		crewLeads(),
		firmToday()
	]);
	return {
		...view,
		photos,
		crew,
		today,
		person: user.name,
		canSchedule: user.role !== 'crew',
		formKey: newToken()
	};
};

export const actions: Actions = {
	schedule: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const data = await event.request.formData();
		const parsed = await parseForm(data, scheduleCallbackSchema, { extra: { form: 'schedule' } });
		if (!parsed.ok) return parsed.failure;
		return jobAction(async () => {
			await callbackFor(user, event.params.id);
			await scheduleCallback(event.params.id, parsed.data);
			return { form: 'schedule', saved: true };
		}, 'schedule');
	},
	hours: async (event) => {
		const user = requireRole(event, 'owner', 'sales', 'crew');
		const data = await event.request.formData();
		const parsed = await parseForm(data, callbackHoursSchema, { extra: { form: 'hours' } });
		if (!parsed.ok) return parsed.failure;
		const { hours, ...rest } = parsed.data;
		return jobAction(async () => {
			await logCallbackHours(user, event.params.id, { ...rest, minutes: hours });
			return { form: 'hours', saved: true };
		}, 'hours');
	},
	close: async (event) => {
		const user = requireRole(event, 'owner', 'sales', 'crew');
		const data = await event.request.formData();
		const parsed = await parseForm(data, closeCallbackSchema, { extra: { form: 'close' } });
		if (!parsed.ok) return parsed.failure;
		return jobAction(async () => {
			await closeCallback(user, event.params.id, parsed.data.notes);
			return { form: 'close', saved: true };
		}, 'close');
	}
};
