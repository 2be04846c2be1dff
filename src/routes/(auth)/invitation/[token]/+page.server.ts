import { fail, redirect } from '@sveltejs/kit';
import { fieldErrors, setPasswordSchema, type FormErrors } from '$lib/schema/auth';
import { acceptInvitation, findOpenInvitation, roleLabel } from '$lib/server/auth/team';
import { startSession } from '$lib/server/auth/signin';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const invitation = await findOpenInvitation(params.token);
	return invitation
		? {
				invitation: {
					name: invitation.name,
					email: invitation.email,
					role: roleLabel(invitation.role)
				}
			}
		: { invitation: null };
};

export const actions: Actions = {
	default: async (event) => {
		const data = await event.request.formData();
		const parsed = setPasswordSchema.safeParse({
			password: data.get('password'),
			confirm: data.get('confirm')
		});
		if (!parsed.success) return fail(400, { errors: fieldErrors(parsed.error) });
		const userId = await acceptInvitation(event.params.token, parsed.data.password);
		if (!userId) {
			return fail(410, {
				errors: {
					_form: 'This invitation has been used or has expired. Ask the owner for a new one.'
				} as FormErrors
			});
		}
		await startSession(event.cookies, userId, event.locals.session?.id, {
			ipAddress: event.getClientAddress(),
			userAgent: event.request.headers.get('user-agent') ?? undefined
		});
		redirect(303, '/office');
	}
};
