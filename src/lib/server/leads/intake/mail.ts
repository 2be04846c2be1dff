// The two e-mails of a new inquiry: the acknowledgment to the prospect and the alert to the
// owner. Plain text and self-contained HTML (no remote images), with the firm's details.
import { BUDGETS, HEARD_FROM, SERVICES, TIMEFRAMES, type InquiryInput } from '$lib/schema/intake';
import type { Settings } from '../../platform/db/schema';
import { escapeHtml } from '../../platform/mail';

export interface InquirySummary {
	number: number;
	leadId: string;
	input: InquiryInput;
	photoCount: number;
	projectTitle?: string;
}

export interface MailParts {
	subject: string;
	text: string;
	html: string;
}

export const reference = (n: number) => `R-${n}`;

const label = <T extends Record<string, string>>(map: T, key: string) =>
	(map as Record<string, string>)[key] ?? key;

/** The rows of "what you sent", shared by both e-mails. */
function summaryRows(s: InquirySummary): [string, string][] {
	const i = s.input;
	const rows: [string, string][] = [
		['Reference', reference(s.number)],
		['Name', i.name],
		['E-mail', i.email],
		['Phone', i.phone || '(none given)'],
		['Site address', [i.street, i.town, i.postalCode].filter(Boolean).join(', ')],
		['What you would like', i.services.map((k) => label(SERVICES, k)).join('; ')],
		['Budget', label(BUDGETS, i.budget)],
		['Timeframe', label(TIMEFRAMES, i.timeframe)],
		['Photos', s.photoCount === 0 ? 'none' : `${s.photoCount}`]
	];
	if (s.projectTitle) rows.push(['Inspired by', s.projectTitle]);
	if (i.heardFrom) rows.push(['Heard of us from', label(HEARD_FROM, i.heardFrom)]);
	rows.push(['Message', i.message || '(no message)']);
	return rows;
}

function firmLines(firm: Settings): string[] {
	const address = [firm.street, firm.town, [firm.region, firm.postalCode].filter(Boolean).join(' ')]
		.filter(Boolean)
		.join(', ');
	return [firm.firmName, address, `Phone ${firm.phone}`, `E-mail ${firm.email}`].filter(Boolean);
}

function textTable(rows: [string, string][]): string {
	return rows.map(([k, v]) => `${k}: ${v.includes('\n') ? '\n' + v : v}`).join('\n');
}

function htmlTable(rows: [string, string][]): string {
	const cells = rows
		.map(
			([k, v]) =>
				`<tr><th align="left" valign="top" style="padding:4px 12px 4px 0;font-weight:600;white-space:nowrap">${escapeHtml(k)}</th><td style="padding:4px 0;white-space:pre-wrap">${escapeHtml(v)}</td></tr>`
		)
		.join('');
	return `<table role="presentation" style="border-collapse:collapse;font-size:15px;margin:0 0 18px">${cells}</table>`;
}

function page(title: string, paragraphs: string[], rows: [string, string][], footer: string[]) {
	const body = paragraphs.map((p) => `<p style="margin:0 0 14px">${escapeHtml(p)}</p>`).join('');
	const foot = footer.map(escapeHtml).join('<br>');
	return `<!doctype html><html><head><meta charset="utf-8"><title>${escapeHtml(title)}</title></head><body style="font-family:Georgia,serif;color:#1d2421;background:#fbf8f2;padding:24px"><div style="max-width:580px;margin:auto"><h1 style="font-size:22px;margin:0 0 16px">${escapeHtml(title)}</h1>${body}${htmlTable(rows)}<p style="font-size:13px;color:#3f4a45;margin-top:28px">${foot}</p></div></body></html>`;
}

export function acknowledgment(firm: Settings, s: InquirySummary): MailParts {
	const ref = reference(s.number);
	const first = s.input.name.split(/\s+/)[0] || s.input.name;
	const subject = `We have your inquiry ${ref} — ${firm.firmName}`;
	const paragraphs = [
		`Hello ${first},`,
		`Thank you for writing to ${firm.firmName}. Your reference number is ${ref}; please quote it if you call or write.`,
		`What happens next: our estimator reads every inquiry and calls or e-mails you within ${firm.replyTargetHours} working hours to talk it through and, if it fits, to book a visit to the yard at a time that suits you.`,
		`What helps at the site visit: a clear way to the spot, knowing where outdoor power is, and any buried lines, sprinklers or septic parts you know of.`,
		`Nobody should dig before underground utilities are marked. In the US, call 811 (or file online) and wait the period your state sets; we do this for every job we build.`,
		`Here is what you sent us:`
	];
	const footer = [
		...firmLines(firm),
		'You get this message because you sent an inquiry through our website.'
	];
	const text = `${paragraphs.join('\n\n')}\n\n${textTable(summaryRows(s))}\n\n-- \n${footer.join('\n')}\n`;
	return { subject, text, html: page(`Thank you — ${ref}`, paragraphs, summaryRows(s), footer) };
}

export function ownerAlert(firm: Settings, s: InquirySummary, leadUrl: string): MailParts {
	const ref = reference(s.number);
	const town = s.input.town ? ` in ${s.input.town}` : '';
	const subject = `New lead ${ref}: ${s.input.name}${town}`;
	const paragraphs = [
		`A new inquiry came in through the website${town}.`,
		`Reply target: within ${firm.replyTargetHours} hours. Open the lead: ${leadUrl}`
	];
	const rows = summaryRows(s);
	const text = `${paragraphs.join('\n\n')}\n\n${textTable(rows)}\n\n-- \n${firm.firmName}\n`;
	return { subject, text, html: page(`New lead ${ref}`, paragraphs, rows, [firm.firmName]) };
}
