import { fail, redirect } from '@sveltejs/kit';
import { fieldErrors, formValues, signInSchema, type FormErrors } from '$lib/schema/auth';
import { safeNext } from '$lib/server/redirects';
import { attemptSignIn, startSession } from '$lib/server/signin';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals, url }) => {
	if (locals.user) redirect(303, safeNext(url.searchParams.get('next')));
	return { next: url.searchParams.get('next') ?? '' };
};

export const actions: Actions = {
	default: async (event) => {
		const data = await event.request.formData();
		const values = formValues(data);
		const parsed = signInSchema.safeParse({
			email: data.get('email'),
			password: data.get('password')
		});
		if (!parsed.success) {
			return fail(400, { values, errors: fieldErrors(parsed.error) as FormErrors, message: '' });
		}
		const ip = event.getClientAddress();
		const result = await attemptSignIn(parsed.data.email, parsed.data.password, ip);
		if (!result.ok && result.reason === 'throttled') {
			return fail(429, {
				values,
				errors: {} as FormErrors,
				message: `Too many sign-in attempts. Wait ${result.minutes} minutes, then try again, or reset your password.`
			});
		}
		if (!result.ok) {
			return fail(400, {
				values,
				errors: {} as FormErrors,
				message: 'That e-mail and password do not match an active account.'
			});
		}
		await startSession(event.cookies, result.userId, event.locals.session?.id, {
			ipAddress: ip,
			userAgent: event.request.headers.get('user-agent') ?? undefined
		});
		redirect(303, safeNext(String(data.get('next') ?? '')));
	}
};
