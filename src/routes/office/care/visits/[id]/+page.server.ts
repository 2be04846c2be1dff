import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { requireRole } from '$lib/server/auth/access';
import { domainAction, orHttp } from '$lib/server/http/domain';
import { serviceVisitPhotoLinks, storeCarePhoto } from '$lib/server/care/photos';
import {
	addPart,
	completeServiceVisit,
	crewServiceView,
	partChoices,
	removePart,
	saveServiceNotes,
	serviceVisitFor,
	tickChecklist
} from '$lib/server/care/service';
import { PhotoError } from '$lib/server/platform/images';
import { StorageUnavailableError } from '$lib/server/platform/storage';
import type { Actions, PageServerLoad } from './$types';
import { parseForm } from '$lib/server/platform/forms';

const STAFF = ['owner', 'sales', 'crew'] as const;

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ...STAFF);
	const visit = await orHttp(() => serviceVisitFor(user, event.params.id));
	const [view, photos, parts] = await Promise.all([
		crewServiceView(visit),
		serviceVisitPhotoLinks(visit.id),
		partChoices()
	]);
	return { visit: view, photos, parts };
};

const tickSchema = z.object({ index: z.coerce.number().int().min(0), done: z.enum(['1', '0']) });
const partSchema = z.object({
	sku: z.string().min(1, 'Pick a part'),
	quantity: z.coerce.number().positive('More than nothing').max(1000, 'At most 1000')
});

export const actions: Actions = {
	tick: async (event) => {
		const user = requireRole(event, ...STAFF);
		const parsed = await parseForm(event.request, tickSchema, {
			extra: { form: 'tick' },
			message: 'Pick a checklist item'
		});
		if (!parsed.ok) return parsed.failure;
		return domainAction(
			() => tickChecklist(user, event.params.id, parsed.data.index, parsed.data.done === '1'),
			'tick'
		);
	},
	notes: async (event) => {
		const user = requireRole(event, ...STAFF);
		const parsed = await parseForm(
			event.request,
			z.object({ notes: z.string().max(4000, 'At most 4000 characters') }),
			{
				extra: { form: 'notes' },
				message: true
			}
		);
		if (!parsed.ok) return parsed.failure;
		const r = await domainAction(
			() => saveServiceNotes(user, event.params.id, parsed.data.notes),
			'notes'
		);
		return r ?? { form: 'notes', saved: true };
	},
	part: async (event) => {
		const user = requireRole(event, ...STAFF);
		const parsed = await parseForm(event.request, partSchema, {
			extra: { form: 'part' },
			message: true
		});
		if (!parsed.ok) return parsed.failure;
		const r = await domainAction(
			() => addPart(user, event.params.id, parsed.data.sku, parsed.data.quantity),
			'part'
		);
		return r ?? { form: 'part', saved: true };
	},
	removePart: async (event) => {
		const user = requireRole(event, ...STAFF);
		const partId = String((await event.request.formData()).get('partId') ?? '');
		if (!partId) return fail(400, { form: 'part', message: 'Pick a part' });
		return domainAction(() => removePart(user, event.params.id, partId), 'part');
	},
	photo: async (event) => {
		const user = requireRole(event, ...STAFF);
		const visit = await orHttp(() => serviceVisitFor(user, event.params.id));
		const file = (await event.request.formData()).get('photo');
		if (!(file instanceof File) || file.size === 0) {
			return fail(400, { form: 'photo', message: 'Choose a photo first' });
		}
		try {
			await storeCarePhoto({ serviceVisitId: visit.id }, file, user.id);
		} catch (e) {
			if (e instanceof PhotoError) return fail(400, { form: 'photo', message: e.message });
			if (e instanceof StorageUnavailableError) {
				return fail(503, {
					form: 'photo',
					message: 'Photo storage is out of reach; try again shortly.'
				});
			}
			throw e;
		}
		return { form: 'photo', saved: true };
	},
	done: async (event) => {
		const user = requireRole(event, ...STAFF);
		const r = await domainAction(() => completeServiceVisit(user, event.params.id), 'done');
		return r ?? { form: 'done', saved: true };
	}
};
