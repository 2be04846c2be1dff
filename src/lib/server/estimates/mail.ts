// The e-mails an estimate sends. Every money figure comes from the stored totals through
// formatCents, the same function the pages use, so the mail agrees with the page to the cent.
import { inZone } from '$lib/firm-time';
import { formatCents } from '$lib/money';
import { origin } from '../platform/env';
import { escapeHtml, htmlBody } from '../platform/mail';
import type { OutgoingMail } from '../platform/outbox';
import type {
	Contact,
	Estimate,
	EstimateAcceptance,
	Lead,
	Settings,
	User
} from '../platform/db/schema';
import type { StoredResult } from './records';

export interface MailContext {
	firm: Settings;
	lead: Lead;
	contact: Contact;
	salesperson: User | null;
	owners: User[];
}

export function estimateUrl(token: string) {
	return `${origin()}/estimate/${token}`;
}

export function sentMail(
	ctx: MailContext,
	row: Estimate & { expiresAt: Date },
	token: string,
	tokenHash: string
): OutgoingMail {
	const url = estimateUrl(token);
	const first = ctx.contact.name.split(/\s+/)[0];
	const lines = [
		`Hello ${first},`,
		`Your estimate from ${ctx.firm.firmName} is ready (R-${ctx.lead.number}, version ${row.number}). As designed, it comes to ${formatCents(row.totalCents)}, with a deposit of ${formatCents(row.depositCents)} to book the install.`,
		'On the estimate page you can choose the options you want, see the total change, and accept it, decline it or ask us a question.',
		`The link is private to you and works until ${inZone(row.expiresAt, ctx.firm.timeZone, 'date')}.`,
		ctx.salesperson ? `${ctx.salesperson.name}, ${ctx.firm.firmName}` : ctx.firm.firmName
	];
	return {
		dedupeKey: `estimate-sent:${row.id}:${tokenHash.slice(0, 16)}`,
		to: ctx.contact.email!,
		subject: `Your estimate from ${ctx.firm.firmName} (R-${ctx.lead.number} v${row.number})`,
		text: `${lines.join('\n\n')}\n\nOpen your estimate: ${url}\n`,
		html: htmlBody(
			lines,
			{ label: 'Open your estimate', url },
			`${ctx.firm.firmName} · ${ctx.firm.phone}`
		),
		leadId: ctx.lead.id
	};
}

function choiceLines(acceptance: EstimateAcceptance, stored: StoredResult): string[] {
	const pricing = stored.priced.pricing;
	const chosen = acceptance.optionsChosen;
	const out: string[] = [];
	for (const o of pricing.options) {
		if (chosen.options.includes(o.id)) {
			out.push(`Option taken: ${o.name} (${formatCents(o.totals.totalCents)})`);
		}
	}
	for (const a of pricing.alternates) {
		const c = a.choices.find((x) => x.id === chosen.alternates[a.id]);
		if (c) out.push(`${a.name}: ${c.name}`);
	}
	return out;
}

export function acceptedMails(
	ctx: MailContext,
	row: Estimate,
	acceptance: EstimateAcceptance,
	stored: StoredResult
): OutgoingMail[] {
	const ref = `R-${ctx.lead.number} v${row.number}`;
	const when = inZone(acceptance.acceptedAt, ctx.firm.timeZone, 'dateTime');
	const summary = [
		`Total: ${formatCents(acceptance.totalCents)}`,
		`Deposit: ${formatCents(acceptance.depositCents)}`,
		`Balance on completion: ${formatCents(acceptance.totalCents - acceptance.depositCents)}`
	];
	const staffLines = [
		`${acceptance.typedName} accepted estimate ${ref} for ${ctx.contact.name} on ${when}.`,
		...choiceLines(acceptance, stored),
		...summary,
		'The lead is now sold.'
	];
	const staff = new Map<string, User>();
	for (const u of ctx.owners) staff.set(u.email.toLowerCase(), u);
	if (ctx.salesperson) staff.set(ctx.salesperson.email.toLowerCase(), ctx.salesperson);
	const officeUrl = `${origin()}/office/leads/${ctx.lead.id}/estimate?v=${row.number}`;
	const mails: OutgoingMail[] = [...staff.values()].map((u) => ({
		dedupeKey: `estimate-accepted:${row.id}:${u.id}`,
		to: u.email,
		subject: `Accepted: ${ctx.contact.name}, ${ref}, ${formatCents(acceptance.totalCents)}`,
		text: `${staffLines.join('\n')}\n\n${officeUrl}\n`,
		html: htmlBody(staffLines, { label: 'Open the estimate', url: officeUrl }, ctx.firm.firmName),
		leadId: ctx.lead.id
	}));
	if (ctx.contact.email) {
		const lines = [
			`Thank you, ${acceptance.typedName}. We have your acceptance of estimate ${ref}, recorded on ${when}.`,
			...choiceLines(acceptance, stored),
			...summary,
			`We will be in touch about the deposit and the install date. ${ctx.firm.firmName} · ${ctx.firm.phone}`
		];
		mails.push({
			dedupeKey: `estimate-accepted:${row.id}:homeowner`,
			to: ctx.contact.email,
			subject: `Your acceptance of estimate ${ref}`,
			text: lines.join('\n') + '\n',
			html: htmlBody(lines, undefined, ctx.firm.firmName),
			leadId: ctx.lead.id
		});
	}
	return mails;
}

export function homeownerMessageMail(
	ctx: MailContext,
	row: Estimate,
	kind: 'decline' | 'question',
	text: string,
	activityId: number
): OutgoingMail | null {
	const to = ctx.salesperson?.email ?? ctx.owners[0]?.email;
	if (!to) return null;
	const ref = `R-${ctx.lead.number} v${row.number}`;
	const heading =
		kind === 'decline'
			? `${ctx.contact.name} declined estimate ${ref}. Their reason:`
			: `${ctx.contact.name} has a question about estimate ${ref}:`;
	const url = `${origin()}/office/leads/${ctx.lead.id}/estimate?v=${row.number}`;
	return {
		dedupeKey: `estimate-${kind}:${row.id}:${activityId}`,
		to,
		subject:
			kind === 'decline'
				? `Declined: ${ctx.contact.name}, ${ref}`
				: `Question from ${ctx.contact.name} about ${ref}`,
		text: `${heading}\n\n${text}\n\n${ctx.contact.email ?? ''} ${ctx.contact.phone ?? ''}\n${url}\n`,
		html: htmlBody(
			[heading, text, `${ctx.contact.email ?? ''} ${ctx.contact.phone ?? ''}`],
			{ label: 'Open the estimate', url },
			ctx.firm.firmName
		),
		leadId: ctx.lead.id
	};
}

export { escapeHtml };
