import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import {
	fieldErrors,
	formValues,
	inviteSchema,
	roleSchema,
	type FormErrors
} from '$lib/schema/auth';
import { requireRole } from '$lib/server/auth/access';
import {
	changeRole,
	invite,
	listMembers,
	pendingInvitations,
	setDisabled,
	TeamError
} from '$lib/server/auth/team';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'owner');
	const [members, invitations] = await Promise.all([listMembers(), pendingInvitations()]);
	return { members, invitations };
};

const memberSchema = z.object({ userId: z.string().min(1) });

async function memberAction(run: () => Promise<void>, userId: string) {
	try {
		await run();
		return { ok: true, userId };
	} catch (error) {
		if (error instanceof TeamError) return fail(400, { memberError: error.message, userId });
		throw error;
	}
}

export const actions: Actions = {
	invite: async (event) => {
		const owner = requireRole(event, 'owner');
		const data = await event.request.formData();
		const parsed = inviteSchema.safeParse(Object.fromEntries(data));
		if (!parsed.success) {
			return fail(400, { invite: { values: formValues(data), errors: fieldErrors(parsed.error) } });
		}
		try {
			await invite(owner.id, parsed.data);
		} catch (error) {
			const message =
				error instanceof TeamError
					? error.message
					: 'The invitation could not be e-mailed just now. Try again in a few minutes.';
			if (!(error instanceof TeamError)) console.error('invitation mail failed', error);
			return fail(error instanceof TeamError ? 400 : 503, {
				invite: { values: formValues(data), errors: { _form: message } as FormErrors }
			});
		}
		return { invited: parsed.data.email };
	},
	role: async (event) => {
		const owner = requireRole(event, 'owner');
		const data = Object.fromEntries(await event.request.formData());
		const parsed = memberSchema.extend({ role: roleSchema }).safeParse(data);
		if (!parsed.success) {
			return fail(400, { memberError: 'Pick a role', userId: String(data.userId ?? '') });
		}
		return memberAction(
			() => changeRole(owner.id, parsed.data.userId, parsed.data.role),
			parsed.data.userId
		);
	},
	disable: async (event) => {
		const owner = requireRole(event, 'owner');
		const parsed = memberSchema.safeParse(Object.fromEntries(await event.request.formData()));
		if (!parsed.success) return fail(400, { memberError: 'No member chosen', userId: '' });
		return memberAction(() => setDisabled(owner.id, parsed.data.userId, true), parsed.data.userId);
	},
	enable: async (event) => {
		const owner = requireRole(event, 'owner');
		const parsed = memberSchema.safeParse(Object.fromEntries(await event.request.formData()));
		if (!parsed.success) return fail(400, { memberError: 'No member chosen', userId: '' });
		return memberAction(() => setDisabled(owner.id, parsed.data.userId, false), parsed.data.userId);
	}
};
