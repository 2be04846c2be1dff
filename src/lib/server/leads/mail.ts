// E-mails staff send from the lead page: a few starting texts the sender edits before sending.
// Each goes through the outbox (sent by the queue, once per send key) and onto the timeline.
import { eq } from 'drizzle-orm';
import { db } from '../platform/db';
import { contacts } from '../platform/db/schema';
import { dispatchMail, writeMail } from '../platform/outbox';
import { htmlBody } from '../platform/mail';
import { firmSettings } from '../platform/settings';
import { LeadEditError, lockedLead, markReplied, record } from './leads';

interface TemplateContext {
	firstName: string;
	number: number;
	firmName: string;
	firmPhone: string;
	senderName: string;
}

export interface MailTemplate {
	key: string;
	label: string;
	subject: (c: TemplateContext) => string;
	body: (c: TemplateContext) => string;
}

export const LEAD_MAIL_TEMPLATES: MailTemplate[] = [
	{
		key: 'first-reply',
		label: 'First reply: when can we talk?',
		subject: (c) => `Your project with ${c.firmName} (R-${c.number})`,
		body: (c) =>
			`Hello ${c.firstName},\n\nThank you for telling us about your yard. I would like to hear a little more about what you have in mind and talk through the next steps.\n\nWhen is a good time for a short call? You can also reach me at ${c.firmPhone}.\n\n${c.senderName}\n${c.firmName}`
	},
	{
		key: 'visit',
		label: 'Offer a site visit',
		subject: (c) => `A site visit for your project (R-${c.number})`,
		body: (c) =>
			`Hello ${c.firstName},\n\nThe best next step is a visit to see the spot, measure it and look at where water, power and access are. It takes about an hour.\n\nReply with two or three times that suit you over the next two weeks and I will confirm one.\n\nBefore anyone digs, underground utilities must be marked (in the US, call 811 and wait the period your state sets); we take care of that before any work starts.\n\n${c.senderName}\n${c.firmName}`
	},
	{
		key: 'photos',
		label: 'Ask for photos',
		subject: (c) => `A few photos of the spot? (R-${c.number})`,
		body: (c) =>
			`Hello ${c.firstName},\n\nCould you send two or three photos of the spot: one wide shot that shows the house or patio nearby, and one close-up of the ground? Just reply to this e-mail with them attached.\n\n${c.senderName}\n${c.firmName}`
	},
	{
		key: 'follow-up',
		label: 'Follow up',
		subject: (c) => `Checking in on your project (R-${c.number})`,
		body: (c) =>
			`Hello ${c.firstName},\n\nI wanted to check in on your project. If the timing has changed, or you have questions about anything we discussed, just reply and let me know.\n\n${c.senderName}\n${c.firmName}`
	}
];

export function templateContext(
	lead: { number: number },
	contactName: string,
	firm: { firmName: string; phone: string },
	senderName: string
): TemplateContext {
	return {
		firstName: contactName.split(/\s+/)[0] || contactName,
		number: lead.number,
		firmName: firm.firmName,
		firmPhone: firm.phone,
		senderName
	};
}

/** The starting texts for the lead page, filled in for this lead and sender. */
export function renderTemplates(context: TemplateContext) {
	return LEAD_MAIL_TEMPLATES.map((t) => ({
		key: t.key,
		label: t.label,
		subject: t.subject(context),
		body: t.body(context)
	}));
}

export async function sendLeadMail(
	sender: { id: string; name: string },
	leadId: string,
	input: { template: string; sendKey: string; subject: string; body: string }
): Promise<{ queued: boolean }> {
	const template = LEAD_MAIL_TEMPLATES.find((t) => t.key === input.template);
	if (!template) throw new LeadEditError('Pick one of the templates');
	const firm = await firmSettings();
	const outboxId = await db.transaction(async (tx) => {
		const lead = await lockedLead(tx, leadId);
		const [contact] = await tx.select().from(contacts).where(eq(contacts.id, lead.contactId));
		if (!contact?.email) throw new LeadEditError('This contact has no e-mail address');
		const id = await writeMail(
			{
				dedupeKey: `lead-mail:${leadId}:${input.sendKey}`,
				to: contact.email,
				subject: input.subject,
				text: input.body,
				html: htmlBody(
					input.body.split(/\n{2,}/),
					undefined,
					`${firm.firmName} · ${firm.phone} · ${firm.email}`
				),
				leadId
			},
			tx
		);
		if (!id) return null; // the same send submitted twice: already written and recorded
		await record(tx, leadId, sender.id, 'email', input.body, {
			subject: input.subject,
			to: contact.email,
			template: template.key,
			outboxId: id
		});
		await markReplied(tx, lead, sender.id, new Date());
		return id;
	});
	if (outboxId) await dispatchMail(outboxId);
	return { queued: outboxId !== null };
}
