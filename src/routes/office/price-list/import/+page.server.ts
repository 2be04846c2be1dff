import { fail } from '@sveltejs/kit';
import { requireRole } from '$lib/server/access';
import { importCsv } from '$lib/server/pricelist';
import { csvTextSchema, previewCsv } from '$lib/server/pricelist-csv';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'owner');
	return {};
};

async function csvFrom(request: Request) {
	const data = await request.formData();
	const file = data.get('file');
	const text =
		file instanceof File && file.size > 0 ? await file.text() : String(data.get('csv') ?? '');
	return csvTextSchema
		.refine((t) => t.trim() !== '', 'Choose a file or paste the CSV')
		.safeParse(text);
}

export const actions: Actions = {
	/** Reads the file and shows every row with its errors; nothing is written. */
	preview: async (event) => {
		requireRole(event, 'owner');
		const text = await csvFrom(event.request);
		if (!text.success) return fail(400, { message: text.error.issues[0].message });
		return { preview: previewCsv(text.data), csv: text.data };
	},
	/** Writes every row, or none when any row is bad. */
	commit: async (event) => {
		requireRole(event, 'owner');
		const text = await csvFrom(event.request);
		if (!text.success) return fail(400, { message: text.error.issues[0].message });
		const result = await importCsv(text.data);
		if (!result.written) {
			return fail(400, {
				preview: result.preview,
				csv: text.data,
				message: 'Nothing was written: fix the rows marked below'
			});
		}
		return { written: result.written };
	}
};
