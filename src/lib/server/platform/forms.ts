// One way to read a form action's input: the posted fields through a zod schema give the typed
// input, or the 400 failure that refills the form (`values`, secrets left out) with each message
// beside its field (`errors`, keyed by the field's path; `_form` for the form as a whole).
import { fail, type ActionFailure } from '@sveltejs/kit';
import type { z } from 'zod';
import { fieldErrors, formValues } from '$lib/schema/auth';

export type FormValues = Record<string, string>;
export type FormErrors = Record<string, string>;

export type ParsedForm<T, E extends object> =
	| { ok: true; data: T; form: FormData; values: FormValues }
	| { ok: false; failure: ActionFailure<E & { values: FormValues; errors: FormErrors }> };

export interface ParseOptions<E extends object> {
	/** More of the failure's data, e.g. `{ form: 'schedule' }` for a page with several forms. */
	extra?: E;
	/** Fields never sent back to refill the form (default: password and confirm). */
	omit?: string[];
}

export async function parseForm<S extends z.ZodType, E extends object = object>(
	source: Request | FormData,
	schema: S,
	options: ParseOptions<E> = {}
): Promise<ParsedForm<z.output<S>, E>> {
	const form = source instanceof FormData ? source : await source.formData();
	const values = formValues(form, options.omit);
	const parsed = schema.safeParse(Object.fromEntries(form));
	if (!parsed.success) {
		const data = { ...(options.extra as E), values, errors: fieldErrors(parsed.error) };
		return { ok: false, failure: fail(400, data) };
	}
	return { ok: true, data: parsed.data, form, values };
}
