// The photo field of a form action: an empty field, a picture that is refused (not a photo, too
// large, truncated) or storage out of reach are messages beside the form; anything else is a
// real error.
import { fail } from '@sveltejs/kit';
import { PhotoError } from '../platform/images';
import { StorageUnavailableError } from '../platform/storage';

export async function photoUpload(
	file: FormDataEntryValue | null,
	store: (file: File) => Promise<unknown>,
	options: { extra?: Record<string, string>; empty?: string } = {}
) {
	const refuse = (status: number, message: string) =>
		fail(status, { form: 'photo', ...options.extra, message });
	if (!(file instanceof File) || file.size === 0) {
		return refuse(400, options.empty ?? 'Choose a photo first');
	}
	try {
		await store(file);
	} catch (e) {
		if (e instanceof PhotoError) return refuse(400, e.message);
		if (e instanceof StorageUnavailableError) {
			return refuse(503, 'Photo storage is out of reach; try again shortly.');
		}
		throw e;
	}
	return { form: 'photo', saved: true };
}
