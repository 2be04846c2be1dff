// One way to read a form action's input: the posted fields through a zod schema give the typed
// input, or the 400 failure that refills the form (`values`, secrets left out) with each message
// beside its field (`errors`, keyed by the field's path; `_form` for the form as a whole). A form
// that is only a button posting hidden ids (tick an item, send an order) has no field to put a
// message beside: it names one `message` for the whole form instead.
import { fail, type ActionFailure } from '@sveltejs/kit';
import type { z } from 'zod';
import { fieldErrors, formValues } from '$lib/schema/auth';

export type FormValues = Record<string, string>;
export type FormErrors = Record<string, string>;

export type FormFailure<E extends object> = E & {
	values: FormValues;
	errors: FormErrors;
	message?: string;
};

export type ParsedForm<T, E extends object> =
	| { ok: true; data: T; form: FormData; values: FormValues }
	| { ok: false; failure: ActionFailure<FormFailure<E>> };

export interface ParseOptions<E extends object> {
	/** More of the failure's data, e.g. `{ form: 'schedule' }` for a page with several forms. */
	extra?: E;
	/** Fields never sent back to refill the form (default: password and confirm). */
	omit?: string[];
	/**
	 * How the schema's input is read from the form, for a form with repeated or nested fields
	 * (default: one string a field name).
	 */
	read?: (form: FormData) => unknown;
	/**
	 * The one message of a form without visible fields, shown above or beside its button: this
	 * text, or `true` for the first of the schema's own messages.
	 */
	message?: string | true;
}

export async function parseForm<S extends z.ZodType, E extends object = object>(
	source: Request | FormData,
	schema: S,
	options: ParseOptions<E> = {}
): Promise<ParsedForm<z.output<S>, E>> {
	const form = source instanceof FormData ? source : await source.formData();
	const values = formValues(form, options.omit);
	const parsed = schema.safeParse(options.read ? options.read(form) : Object.fromEntries(form));
	if (!parsed.success) {
		const errors = fieldErrors(parsed.error);
		const data: FormFailure<E> = { ...(options.extra as E), values, errors };
		if (options.message) {
			data.message = options.message === true ? Object.values(errors)[0] : options.message;
		}
		return { ok: false, failure: fail(400, data) };
	}
	return { ok: true, data: parsed.data, form, values };
}
