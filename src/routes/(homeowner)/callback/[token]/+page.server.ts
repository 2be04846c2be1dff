import { error, fail } from '@sveltejs/kit';
import { fieldErrors } from '$lib/schema/auth';
import { reportSchema } from '$lib/schema/callbacks';
import { PHOTO_LIMITS } from '$lib/schema/intake';
import { PhotoError } from '$lib/server/platform/images';
import { StorageUnavailableError } from '$lib/server/platform/storage';
import {
	callbackPage,
	CallbackInputError,
	MAX_CALLBACK_PHOTOS,
	reportProblem
} from '$lib/server/callbacks/callbacks';
import type { Actions, PageServerLoad } from './$types';

const GONE = 'This link is not valid. Please use the newest link we e-mailed you, or call us.';

export const load: PageServerLoad = async ({ params }) => {
	const page = await callbackPage(params.token);
	if (!page) error(404, GONE);
	return { ...page, maxPhotos: MAX_CALLBACK_PHOTOS, accept: PHOTO_LIMITS.accept };
};

export const actions: Actions = {
	default: async ({ params, request }) => {
		const data = await request.formData();
		const description = String(data.get('description') ?? '');
		const parsed = reportSchema.safeParse({ description });
		if (!parsed.success) {
			return fail(400, { description, errors: fieldErrors(parsed.error) });
		}
		const files = data.getAll('photos').filter((f): f is File => f instanceof File && f.size > 0);
		try {
			const done = await reportProblem(params.token, parsed.data.description, files);
			if (!done) error(404, GONE);
			return { reported: true, inWarranty: done.inWarranty };
		} catch (e) {
			if (e instanceof PhotoError || e instanceof CallbackInputError) {
				return fail(400, { description, errors: { photos: e.message } });
			}
			if (e instanceof StorageUnavailableError) {
				return fail(503, {
					description,
					errors: {
						photos:
							'Photos cannot be stored just now; try again shortly, or send it without photos.'
					}
				});
			}
			throw e;
		}
	}
};
