import { fail, type ActionFailure } from '@sveltejs/kit';
import { z } from 'zod';
import { inviteSchema, roleSchema } from '$lib/schema/auth';
import { parseForm, type FormFailure } from '$lib/server/platform/forms';
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

// A member's row (role, disable, enable) shows its one message beside that member.
async function memberAction(run: () => Promise<void>, userId: string) {
	try {
		await run();
		return { ok: true, userId };
	} catch (error) {
		if (error instanceof TeamError) {
			return fail(400, { form: 'member', userId, message: error.message });
		}
		throw error;
	}
}

function memberFailure(failure: ActionFailure<FormFailure<object>>) {
	const { values, message } = failure.data;
	return fail(400, { form: 'member', userId: values.userId ?? '', message });
}

export const actions: Actions = {
	invite: async (event) => {
		const owner = requireRole(event, 'owner');
		const parsed = await parseForm(event.request, inviteSchema, { extra: { form: 'invite' } });
		if (!parsed.ok) return parsed.failure;
		try {
			await invite(owner.id, parsed.data);
		} catch (error) {
			const message =
				error instanceof TeamError
					? error.message
					: 'The invitation could not be e-mailed just now. Try again in a few minutes.';
			if (!(error instanceof TeamError)) console.error('invitation mail failed', error);
			return fail(error instanceof TeamError ? 400 : 503, {
				form: 'invite',
				values: parsed.values,
				errors: { _form: message }
			});
		}
		return { invited: parsed.data.email };
	},
	role: async (event) => {
		const owner = requireRole(event, 'owner');
		const parsed = await parseForm(event.request, memberSchema.extend({ role: roleSchema }), {
			message: 'Pick a role'
		});
		if (!parsed.ok) return memberFailure(parsed.failure);
		return memberAction(
			() => changeRole(owner.id, parsed.data.userId, parsed.data.role),
			parsed.data.userId
		);
	},
	disable: async (event) => {
		const owner = requireRole(event, 'owner');
		const parsed = await parseForm(event.request, memberSchema, { message: 'No member chosen' });
		if (!parsed.ok) return memberFailure(parsed.failure);
		return memberAction(() => setDisabled(owner.id, parsed.data.userId, true), parsed.data.userId);
	},
	enable: async (event) => {
		const owner = requireRole(event, 'owner');
		const parsed = await parseForm(event.request, memberSchema, { message: 'No member chosen' });
		if (!parsed.ok) return memberFailure(parsed.failure);
		return memberAction(() => setDisabled(owner.id, parsed.data.userId, false), parsed.data.userId);
	}
};
