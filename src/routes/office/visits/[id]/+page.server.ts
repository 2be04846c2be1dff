import { error, fail } from '@sveltejs/kit';

import { visitNotesSchema } from '$lib/schema/visits';
import { requireRole } from '$lib/server/auth/access';
import type { SessionUser } from '$lib/server/auth/sessions';
import { StorageUnavailableError } from '$lib/server/platform/storage';
import {
	deleteVisitPhoto,
	storeVisitPhoto,
	visitPhotoLinks
} from '$lib/server/photos/visit-photos';
import { saveNotes } from '$lib/server/visits/notes';
import { visitDetail } from '$lib/server/visits/agenda';
import { parseForm } from '$lib/server/platform/forms';
import type { Actions, PageServerLoad } from './$types';
import { photoUpload } from '$lib/server/http/photo-upload';

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
		const parsed = await parseForm(event.request, visitNotesSchema);
		if (!parsed.ok) return parsed.failure;
		if (!(await saveNotes(event.params.id, parsed.data, user.id))) error(404, 'No such visit');
		return { saved: true };
	},
	photo: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		await visitFor(user, event.params.id);
		const file = (await event.request.formData()).get('photo');
		return photoUpload(
			file,
			async (f) => {
				const bytes = new Uint8Array(await f.arrayBuffer());
				if (!(await storeVisitPhoto(event.params.id, f.name, bytes, user.id))) {
					error(404, 'No such visit');
				}
			},
			{ empty: 'Choose a photo first.' }
		);
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
