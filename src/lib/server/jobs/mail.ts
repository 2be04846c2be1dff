// The e-mails of the jobs domain: change orders to approve, decisions for the office, the
// testimonial request and the seasonal care reminders. Plain text first, the same words in HTML.
import { htmlBody } from '../platform/mail';
import type { Settings } from '../platform/db/schema';
import { formatCents } from '$lib/money';

function signOff(firm: Settings): string {
	return `${firm.firmName} · ${firm.phone} · ${firm.email}`;
}

export interface Built {
	subject: string;
	text: string;
	html: string;
}

function build(
	subject: string,
	paragraphs: string[],
	firm: Settings,
	action?: { label: string; url: string },
	footer = ''
): Built {
	const text = [
		...paragraphs,
		...(action ? [`${action.label}: ${action.url}`] : []),
		'',
		signOff(firm),
		...(footer ? [footer] : [])
	].join('\n\n');
	return {
		subject,
		text,
		html: htmlBody(paragraphs, action, [signOff(firm), footer].filter(Boolean).join(' · '))
	};
}

export function changeOrderMail(input: {
	firm: Settings;
	name: string;
	jobTitle: string;
	number: number;
	title: string;
	lines: { description: string; quantity: number; unit: string; extendedCents: number }[];
	totalCents: number;
	url: string;
}): Built {
	const lines = input.lines.map(
		(l) => `• ${l.description}: ${l.quantity} ${l.unit}, ${formatCents(l.extendedCents)}`
	);
	return build(
		`Change order CO-${input.number} for your project: ${input.title}`,
		[
			`Hello ${input.name},`,
			`We have written up a change to "${input.jobTitle}": ${input.title}.`,
			...lines,
			`This change ${input.totalCents >= 0 ? 'adds' : 'takes'} ${formatCents(Math.abs(input.totalCents))} ${input.totalCents >= 0 ? 'to' : 'off'} the job's total. Nothing changes until you approve it through the private link below; you can also decline it there.`
		],
		input.firm,
		{ label: 'Review the change order', url: input.url }
	);
}

export function changeOrderDecisionMail(input: {
	firm: Settings;
	jobRef: string;
	number: number;
	title: string;
	decision: 'approved' | 'declined';
	typedName: string;
	totalCents: number;
	reason?: string | null;
	url: string;
}): Built {
	return build(
		`${input.jobRef} CO-${input.number} ${input.decision} by the homeowner`,
		[
			`${input.typedName} ${input.decision} change order CO-${input.number} (${input.title}) for ${formatCents(input.totalCents)}.`,
			...(input.reason ? [`Their reason: ${input.reason}`] : [])
		],
		input.firm,
		{ label: 'Open the job', url: input.url }
	);
}

export function testimonialRequestMail(input: {
	firm: Settings;
	name: string;
	jobTitle: string;
	url: string;
	/** The care plan offer with the property's private link, when a plan covers the feature. */
	care?: { paragraph: string; action: { label: string; url: string } };
	problemUrl?: string;
}): Built {
	return build(
		`How is your new water feature? A few words for ${input.firm.firmName}`,
		[
			`Hello ${input.name},`,
			`Thank you for having us build "${input.jobTitle}". Now that it has had a few days to settle in, would you tell us in a few sentences how it turned out?`,
			'With your permission we show kind words on our website, with your first name and town only. Nothing appears until we have read it.',
			...(input.care
				? [input.care.paragraph, `${input.care.action.label}: ${input.care.action.url}`]
				: []),
			...(input.problemUrl
				? [`If anything is ever not right with it, tell us here, with a photo: ${input.problemUrl}`]
				: [])
		],
		input.firm,
		{ label: 'Write a few words', url: input.url }
	);
}

interface CareReminderInput {
	firm: Settings;
	name: string;
	kind: 'shutdown' | 'startup' | 'lighting';
	jobTitle: string;
	unsubscribeUrl: string;
	/** Care plans: the visit notice or the plan offer, in place of "reply to book". */
	care?: { paragraph: string; action: { label: string; url: string } };
}

export function careReminderMail(input: CareReminderInput): Built {
	if (input.kind === 'lighting') return lightingCheckMail(input);
	const paragraphs =
		input.kind === 'shutdown'
			? [
					`Hello ${input.name},`,
					`Frost is on its way. Before the first hard freeze, your water feature ("${input.jobTitle}") wants its autumn shut-down: unplug the pump at its ground-fault (GFCI) outlet, lift it out, rinse it and store it indoors in a bucket of water so its seals stay soft; drain the lines so no water freezes in them; leave the basin topped up or drained as we showed you.`,
					'We can do it for you: reply to this e-mail or call us to book a visit.'
				]
			: [
					`Hello ${input.name},`,
					`Spring is here. Once nights stay above freezing, your water feature ("${input.jobTitle}") is ready for its start-up: clear leaves from the basin, set the pump back, top up the water, plug the pump into its ground-fault (GFCI) outlet and check every outlet runs evenly.`,
					'Any outlet wiring or a tripping GFCI is work for a licensed electrician. We are glad to do the start-up for you: reply or call to book it.'
				];
	if (input.care) paragraphs[paragraphs.length - 1] = input.care.paragraph;
	return build(
		input.kind === 'shutdown'
			? `Time for the autumn shut-down of your water feature`
			: `Time for the spring start-up of your water feature`,
		paragraphs,
		input.firm,
		input.care?.action,
		`No more seasonal reminders: ${input.unsubscribeUrl}`
	);
}

/** A lighting-only job's autumn reminder: what to look at, and what is an electrician's work. */
function lightingCheckMail(input: CareReminderInput): Built {
	const paragraphs = [
		`Hello ${input.name},`,
		`Evenings are drawing in, a good time to look over your garden lighting ("${input.jobTitle}"): trim back plants that have grown over the fixtures, wipe the lenses, straighten any light that was knocked, note any lamp that stays dark, and set the transformer's timer for the shorter days.`,
		'Leave the transformer plugged into its ground-fault (GFCI) outlet. A tripping GFCI, or any work on the outlet or the house wiring, is for a licensed electrician.',
		input.care?.paragraph ??
			'We are glad to do the lighting check for you: reply to this e-mail or call us to book it.'
	];
	return build(
		'Time for the autumn check of your garden lighting',
		paragraphs,
		input.firm,
		input.care?.action,
		`No more seasonal reminders: ${input.unsubscribeUrl}`
	);
}
