// Photo uploads for the inquiry form (public: a prospect is anonymous). Each photo is processed
// and stored at once and comes back as a draft token the form sends instead of the file.
// The role table lists this path as public; abuse is held back by a per-address rate limit.
import { error, json } from '@sveltejs/kit';
import { PHOTO_LIMITS } from '$lib/schema/intake';
import { bodyLimitFor } from '$lib/server/http/body-limits';
import { deleteDraft, uploadDraft } from '$lib/server/leads/intake/drafts';
import { uploadLimiter } from '$lib/server/leads/intake/limits';
import type { RequestHandler } from './$types';

/** What the upload accepts, for clients that want to check before sending. */
export const GET: RequestHandler = () =>
	json({
		maxFiles: PHOTO_LIMITS.maxFiles,
		maxBytes: PHOTO_LIMITS.maxBytes,
		maxTotalBytes: PHOTO_LIMITS.maxTotalBytes,
		accept: PHOTO_LIMITS.accept.split(',')
	});

export const POST: RequestHandler = async (event) => {
	if (await uploadLimiter.isLimited(event)) {
		return json(
			{ message: 'Too many photos from this address just now. Please wait a few minutes.' },
			{ status: 429, headers: { 'retry-after': '900' } }
		);
	}
	// The same room for the form around the photo as the body hook allows, so a body between
	// the photo limit and that room is answered the same way by both.
	const limit = bodyLimitFor('/api/uploads');
	const declared = Number(event.request.headers.get('content-length') ?? 0);
	if (declared > limit.bytes) return json({ message: limit.message }, { status: 413 });
	let form: FormData;
	try {
		form = await event.request.formData();
	} catch {
		error(400, 'Send the photo as multipart form data in the field “file”.');
	}
	const file = form.get('file');
	const result = await uploadDraft(file instanceof File ? file : null);
	if (!result.ok) return json({ message: result.message }, { status: result.status });
	return json(result.draft, { status: 201 });
};

export const DELETE: RequestHandler = async (event) => {
	if (await uploadLimiter.isLimited(event)) {
		return json({ message: 'Too many requests just now.' }, { status: 429 });
	}
	const token = event.url.searchParams.get('token') ?? '';
	if (!/^[A-Za-z0-9_-]{16,64}$/.test(token)) error(400, 'Unknown photo');
	const removed = await deleteDraft(token);
	return new Response(null, { status: removed ? 204 : 404 });
};
