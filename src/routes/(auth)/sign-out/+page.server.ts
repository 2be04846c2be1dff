import { redirect } from '@sveltejs/kit';
import { blankSessionCookie, endSession } from '$lib/server/auth/sessions';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = () => redirect(303, '/office');

export const actions: Actions = {
	default: async ({ locals, cookies }) => {
		if (locals.session) await endSession(locals.session.id);
		const blank = blankSessionCookie();
		cookies.set(blank.name, blank.value, { ...blank.attributes, path: '/' });
		redirect(303, '/sign-in?signedOut=1');
	}
};
