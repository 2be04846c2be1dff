// What a page's form action sends back about one of its forms (parseForm's failure: the values
// to refill and the messages by field; or a success), and how a form reads its own part of it.

export interface FormState {
	/** Which of the page's forms the answer is about. */
	form?: string;
	values?: Record<string, string>;
	errors?: Record<string, string>;
	message?: string;
	saved?: unknown;
}

/**
 * The refill value and the message of each field of the form named `name`, when the answer is
 * about that form; after a save the form starts again from its defaults.
 */
export function formFields(form: FormState | null | undefined, name: string) {
	const mine = form?.form === name ? form : null;
	return {
		mine,
		value: (key: string, fallback = '') =>
			(mine?.saved ? undefined : mine?.values?.[key]) ?? fallback,
		error: (key: string): string | undefined => mine?.errors?.[key]
	};
}
