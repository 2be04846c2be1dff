import { error, fail } from '@sveltejs/kit';
import { fieldErrors, formValues } from '$lib/schema/auth';
import { visitNotesSchema } from '$lib/schema/visits';
import { requireRole } from '$lib/server/auth/access';
import type { SessionUser } from '$lib/server/auth/sessions';
import { PhotoError } from '$lib/server/platform/images';
import { StorageUnavailableError } from '$lib/server/platform/storage';
import {
	deleteVisitPhoto,
	storeVisitPhoto,
	visitPhotoLinks
} from '$lib/server/photos/visit-photos';
import { saveNotes } from '$lib/server/visits/notes';
import { visitDetail } from '$lib/server/visits/agenda';
import type { Actions, PageServerLoad } from './$types';

/** The visit, or a 404 for an unknown one and a 403 for another salesperson's closed visit. */
async function visitFor(user: SessionUser, id: string) {
	const detail = await visitDetail(id);
	if (!detail) error(404, 'No such visit');
	if (
		user.role === 'sales' &&
		detail.visit.salespersonId !== user.id &&
		detail.visit.status !== 'booked'
	) {
		error(403, 'This visit is not yours');
	}
	return detail;
}

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'owner', 'sales');
	const detail = await visitFor(user, event.params.id);
	return {
		visitPhotos: await visitPhotoLinks(detail.visit.id),
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
		await visitFor(user, event.params.id);
		const data = await event.request.formData();
		const parsed = visitNotesSchema.safeParse(Object.fromEntries(data));
		if (!parsed.success) {
			return fail(400, { values: formValues(data), errors: fieldErrors(parsed.error) });
		}
		if (!(await saveNotes(event.params.id, parsed.data, user.id))) error(404, 'No such visit');
		return { saved: true };
	},
	photo: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		await visitFor(user, event.params.id);
		const file = (await event.request.formData()).get('photo');
		if (!(file instanceof File) || file.size === 0) {
			return fail(400, { form: 'photo', message: 'Choose a photo first.' });
		}
		try {
			const bytes = new Uint8Array(await file.arrayBuffer());
			if (!(await storeVisitPhoto(event.params.id, file.name, bytes, user.id))) {
				error(404, 'No such visit');
			}
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
	deletePhoto: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const detail = await visitFor(user, event.params.id);
		// A colleague may add to a booked visit, but only its own salesperson or the owner removes.
		if (user.role === 'sales' && detail.visit.salespersonId !== user.id) {
			return fail(403, {
				form: 'deletePhoto',
				message: 'Only the visit’s own salesperson or the owner can delete its photos.'
			});
		}
		const photoId = String((await event.request.formData()).get('photoId') ?? '');
		try {
			if (!photoId || !(await deleteVisitPhoto(event.params.id, photoId))) {
				return fail(404, { form: 'deletePhoto', message: 'That photo is already gone.' });
			}
		} catch (e) {
			if (e instanceof StorageUnavailableError) {
				return fail(503, {
					form: 'deletePhoto',
					message: 'Photo storage is out of reach; the photo is still here. Try again shortly.'
				});
			}
			throw e;
		}
		return { form: 'deletePhoto', deleted: true };
	}
};
