// The e-mails of seasonal care: the plan offer, the sign-up confirmation, the renewal reminder,
// the visit date, a request for another date (to the office), the visit report. Plain text
// first, the same words in HTML (no remote images).
import { htmlBody } from '../platform/mail';
import type { Settings } from '../platform/db/schema';
import { calendarDay } from '$lib/firm-time';

export interface Built {
	subject: string;
	text: string;
	html: string;
}

export function build(
	firm: Settings,
	subject: string,
	paragraphs: string[],
	action?: { label: string; url: string },
	footer = ''
): Built {
	const signOff = `${firm.firmName} · ${firm.phone} · ${firm.email}`;
	const text = [
		...paragraphs,
		...(action ? [`${action.label}: ${action.url}`] : []),
		'',
		signOff,
		...(footer ? [footer] : [])
	].join('\n\n');
	return {
		subject,
		text,
		html: htmlBody(paragraphs, action, [signOff, footer].filter(Boolean).join(' · '))
	};
}

/** A care day in a mail: "Friday, May 14, 2027". */
export const dayText = (day: string) => calendarDay(day, 'dayLong');
