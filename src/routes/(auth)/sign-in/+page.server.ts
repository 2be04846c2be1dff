import { fail, redirect } from '@sveltejs/kit';
import { fieldErrors, formValues, signInSchema, type FormErrors } from '$lib/schema/auth';
import { safeNext } from '$lib/server/http/redirects';
import { DEVICE_COOKIE, setDeviceCookie } from '$lib/server/auth/device';
import { attemptSignIn, startSession } from '$lib/server/auth/signin';
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
		const result = await attemptSignIn(
			parsed.data.email,
			parsed.data.password,
			ip,
			event.cookies.get(DEVICE_COOKIE)
		);
		if (!result.ok && result.reason === 'throttled') {
			event.setHeaders({ 'retry-after': String(result.seconds) });
			return fail(429, {
				values,
				errors: {} as FormErrors,
				message: `Too many failed sign-ins for this account or from this network. Wait ${result.seconds} ${result.seconds === 1 ? 'second' : 'seconds'}, then try again. A browser you have signed in with before is not held up.`
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
		setDeviceCookie(event.cookies, result.userId);
		redirect(303, safeNext(String(data.get('next') ?? '')));
	}
};
