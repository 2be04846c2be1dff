import { fail, redirect } from '@sveltejs/kit';
import { fieldErrors, setPasswordSchema, type FormErrors } from '$lib/schema/auth';
import { completePasswordReset, findOpenReset } from '$lib/server/auth/team';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => ({
	valid: !!(await findOpenReset(params.token))
});

export const actions: Actions = {
	default: async ({ request, params }) => {
		const data = await request.formData();
		const parsed = setPasswordSchema.safeParse({
			password: data.get('password'),
			confirm: data.get('confirm')
		});
		if (!parsed.success) return fail(400, { errors: fieldErrors(parsed.error) });
		const done = await completePasswordReset(params.token, parsed.data.password);
		if (!done) {
			return fail(410, {
				errors: { _form: 'This link no longer works. Ask for a new one.' } as FormErrors
			});
		}
		redirect(303, '/sign-in?reset=1');
	}
};
