import { fail } from '@sveltejs/kit';
import { requireRole } from '$lib/server/auth/access';
import { importPriceList } from '$lib/server/pricelist/catalog';
import {
	csvTextSchema,
	LABOR_TASKS,
	listChoiceSchema,
	previewPriceList
} from '$lib/server/pricelist/csv';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'owner');
	return { tasks: LABOR_TASKS.map(({ id, unit }) => ({ id, unit })) };
};

async function upload(request: Request) {
	const data = await request.formData();
	const file = data.get('file');
	const text =
		file instanceof File && file.size > 0 ? await file.text() : String(data.get('csv') ?? '');
	const csv = csvTextSchema
		.refine((t) => t.trim() !== '', 'Choose a file or paste the CSV')
		.safeParse(text);
	const list = listChoiceSchema.safeParse(String(data.get('list') || 'auto'));
	const values = { csv: csv.success ? csv.data : '', list: list.success ? list.data : 'auto' };
	if (!list.success) return { ok: false, values, message: list.error.issues[0].message } as const;
	if (!csv.success) return { ok: false, values, message: csv.error.issues[0].message } as const;
	return { ok: true, values, csv: csv.data, list: list.data } as const;
}

export const actions: Actions = {
	/** Reads the file and shows every row with its errors; nothing is written. */
	preview: async (event) => {
		requireRole(event, 'owner');
		const input = await upload(event.request);
		if (!input.ok) return fail(400, { ...input.values, message: input.message });
		return { ...input.values, preview: previewPriceList(input.csv, input.list) };
	},
	/** Writes every row, or none when any row is bad. */
	commit: async (event) => {
		requireRole(event, 'owner');
		const input = await upload(event.request);
		if (!input.ok) return fail(400, { ...input.values, message: input.message });
		const result = await importPriceList(input.csv, input.list);
		if (!result.written) {
			return fail(400, {
				...input.values,
				preview: result.preview,
				message: 'Nothing was written: fix the rows marked below'
			});
		}
		return { written: result.written, writtenList: result.preview.list };
	}
};
