import { fail } from '@sveltejs/kit';
import { fieldErrors, forgotSchema, formValues, type FormErrors } from '$lib/schema/auth';
import { requestPasswordReset } from '$lib/server/auth/team';
import type { Actions } from './$types';

export const actions: Actions = {
	default: async ({ request }) => {
		const data = await request.formData();
		const parsed = forgotSchema.safeParse({ email: data.get('email') });
		if (!parsed.success) {
			return fail(400, {
				values: formValues(data),
				errors: fieldErrors(parsed.error),
				sent: false
			});
		}
		try {
			await requestPasswordReset(parsed.data.email);
		} catch (error) {
			console.error('password reset mail failed', error);
			return fail(503, {
				values: formValues(data),
				errors: {
					_form: 'We could not send e-mail just now. Try again in a few minutes.'
				} as FormErrors,
				sent: false
			});
		}
		return { sent: true, values: {} as FormErrors, errors: {} as FormErrors };
	}
};
