import { error, fail } from '@sveltejs/kit';
import { formValues } from '$lib/schema/auth';
import {
	assignFormSchema,
	detailsFormSchema,
	logFormSchema,
	mailFormSchema,
	mergeFormSchema,
	priorityFormSchema,
	stageFormSchema
} from '$lib/schema/leads';
import { requireRole } from '$lib/server/auth/access';
import { newToken } from '$lib/server/platform/crypto';
import { renderTemplates, sendLeadMail, templateContext } from '$lib/server/leads/mail';
import {
	assignableStaff,
	assignLead,
	changeStage,
	getLead,
	LeadConflictError,
	LeadEditError,
	LeadNotFoundError,
	logActivity,
	setPriority,
	updateDetails
} from '$lib/server/leads/leads';
import { firmSettings } from '$lib/server/platform/settings';
import {
	mergeContacts,
	MergeError,
	possibleDuplicates,
	samePerson
} from '$lib/server/leads/contact-merge';
import { galleryLinks } from '$lib/server/photos/links';
import { visitNotesOfLead } from '$lib/server/visits/notes';
import type { Actions, PageServerLoad } from './$types';
import { parseForm } from '$lib/server/platform/forms';

/** Photo links live five minutes; the page asks for fresh ones when it reloads. */
const PHOTO_LINK_SECONDS = 300;

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'owner', 'sales');
	const found = await getLead(event.params.id);
	if (!found) error(404, 'No lead with that number');
	// Photos taken at a visit are shown with that visit's notes, not among the inquiry's.
	const inquiryPhotos = found.photos.filter((p) => p.context !== 'visit');
	const [staff, firm, visitNotes, photos, duplicates, samePersonOf] = await Promise.all([
		assignableStaff(),
		firmSettings(),
		visitNotesOfLead(found.lead.id),
		galleryLinks(
			inquiryPhotos.map((p) => ({
				id: p.id,
				width: p.width,
				height: p.height,
				name: p.originalName,
				thumbKey: p.thumbKey,
				displayKey: p.displayKey
			})),
			PHOTO_LINK_SECONDS
		),
		possibleDuplicates(found.contact.id),
		samePerson(found.contact.id)
	]);
	const templates = renderTemplates(
		templateContext(found.lead, found.contact.name, firm, user.name)
	);
	return {
		lead: found.lead,
		contact: found.contact,
		property: found.property,
		updatedByName: found.updatedByName,
		photos,
		visitNotes,
		timeline: found.timeline,
		duplicates,
		samePerson: samePersonOf,
		staff,
		templates,
		sendKey: newToken(),
		replyTargetHours: firm.replyTargetHours
	};
};

type Outcome = { form: string; ok: string } | ReturnType<typeof fail>;

/** Runs an edit; turns a stale version into a 409 with who changed it and when. */
async function edit(
	form: string,
	data: FormData,
	run: () => Promise<void>,
	ok: string
): Promise<Outcome> {
	try {
		await run();
		return { form, ok };
	} catch (err) {
		if (err instanceof LeadConflictError) return fail(409, { form, conflict: err.message });
		if (err instanceof LeadEditError) {
			return fail(400, { form, values: formValues(data), errors: { _form: err.message } });
		}
		if (err instanceof LeadNotFoundError) error(404, err.message);
		throw err;
	}
}

export const actions: Actions = {
	stage: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const data = await event.request.formData();
		const p = await parseForm(data, stageFormSchema, { extra: { form: 'stage' } });
		if (!p.ok) return p.failure;
		return edit(
			'stage',
			data,
			() => changeStage(user.id, event.params.id, p.data),
			'Stage changed'
		);
	},
	assign: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const data = await event.request.formData();
		const p = await parseForm(data, assignFormSchema, { extra: { form: 'assign' } });
		if (!p.ok) return p.failure;
		return edit('assign', data, () => assignLead(user.id, event.params.id, p.data), 'Assigned');
	},
	priority: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const data = await event.request.formData();
		const p = await parseForm(data, priorityFormSchema, { extra: { form: 'priority' } });
		if (!p.ok) return p.failure;
		return edit(
			'priority',
			data,
			() => setPriority(user.id, event.params.id, p.data),
			'Priority set'
		);
	},
	details: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const data = await event.request.formData();
		const p = await parseForm(data, detailsFormSchema, { extra: { form: 'details' } });
		if (!p.ok) return p.failure;
		return edit(
			'details',
			data,
			() => updateDetails(user.id, event.params.id, p.data),
			'Details saved'
		);
	},
	log: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const data = await event.request.formData();
		const p = await parseForm(data, logFormSchema, { extra: { form: 'log' } });
		if (!p.ok) return p.failure;
		const what = p.data.kind === 'call' ? 'Call logged' : 'Note added';
		return edit('log', data, () => logActivity(user.id, event.params.id, p.data), what);
	},
	merge: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const data = await event.request.formData();
		const p = await parseForm(data, mergeFormSchema, { extra: { form: 'merge' } });
		if (!p.ok) return p.failure;
		const found = await getLead(event.params.id);
		if (!found) error(404, 'No lead with that number');
		try {
			await mergeContacts(found.contact.id, p.data.contactId, user);
		} catch (err) {
			if (err instanceof MergeError) {
				return fail(400, { form: 'merge', values: {}, errors: { _form: err.message } });
			}
			throw err;
		}
		return { form: 'merge', ok: 'Merged: both leads now show the same person' };
	},
	mail: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const data = await event.request.formData();
		const p = await parseForm(data, mailFormSchema, { extra: { form: 'mail' } });
		if (!p.ok) return p.failure;
		return edit(
			'mail',
			data,
			async () => {
				await sendLeadMail(user, event.params.id, p.data);
			},
			'E-mail queued: it goes out within a minute'
		);
	}
};
