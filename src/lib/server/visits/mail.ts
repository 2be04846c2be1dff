// The visit's e-mails: invitations (with an RFC 5545 .ics made by ical-generator), updates on
// reschedule, cancellations (METHOD:CANCEL) and the reminders the day before. Only writes to the
// outbox; the caller dispatches after its transaction commits.
import { TZDate } from '@date-fns/tz';
import ical, { ICalAttendeeRole, ICalCalendarMethod, ICalEventStatus } from 'ical-generator';
import { relativeDay } from '$lib/scheduling/reminders';
import { calendarDate } from '$lib/scheduling/zone';
import { vtimezone } from '$lib/scheduling/vtimezone';
import type { Tx } from '../platform/db';
import type { Settings, SiteVisit } from '../platform/db/schema';
import { origin } from '../platform/env';
import { htmlBody } from '../platform/mail';
import { writeMail } from '../platform/outbox';

export interface VisitParty {
	visit: SiteVisit;
	leadNumber: number;
	homeowner: { name: string; email: string | null };
	salesperson: { name: string; email: string };
	address: string;
	firm: Settings;
}

export { DIG_CAUTION, VISIT_HELPS } from '$lib/cautions/advice-text';
import { DIG_CAUTION, VISIT_HELPS } from '$lib/cautions/advice-text';
import { inZone } from '$lib/firm-time';

/** The invitation's UID: the same for the life of the visit, so calendars update one event. */
export function visitUid(visitId: string): string {
	return `site-visit-${visitId}@rillstone`;
}

export function whenText(visit: Pick<SiteVisit, 'startsAt' | 'endsAt' | 'timeZone'>): string {
	const time = (at: Date) => inZone(at, visit.timeZone, 'time');
	return `${inZone(visit.startsAt, visit.timeZone, 'dayLong')}, ${time(visit.startsAt)} – ${time(visit.endsAt)}`;
}

export function visitIcs(p: VisitParty, method: 'REQUEST' | 'CANCEL'): string {
	const { visit, firm } = p;
	const tz = visit.timeZone;
	const cal = ical({
		prodId: { company: 'Rillstone', product: 'site-visits', language: 'EN' },
		method: method === 'CANCEL' ? ICalCalendarMethod.CANCEL : ICalCalendarMethod.REQUEST
	});
	const attendees = [
		{ name: p.salesperson.name, email: p.salesperson.email, role: ICalAttendeeRole.REQ }
	];
	if (p.homeowner.email) {
		attendees.push({
			name: p.homeowner.name,
			email: p.homeowner.email,
			role: ICalAttendeeRole.REQ
		});
	}
	cal.createEvent({
		id: visitUid(visit.id),
		sequence: visit.sequence,
		stamp: new Date(),
		start: new TZDate(visit.startsAt.getTime(), tz),
		end: new TZDate(visit.endsAt.getTime(), tz),
		timezone: tz,
		summary: `Site visit: ${firm.firmName} (R-${p.leadNumber})`,
		location: p.address,
		description: [
			`${p.salesperson.name} from ${firm.firmName} comes to measure the spot.`,
			visit.noteForHomeowner,
			`Questions: ${firm.phone}`
		]
			.filter(Boolean)
			.join('\n'),
		status: method === 'CANCEL' ? ICalEventStatus.CANCELLED : ICalEventStatus.CONFIRMED,
		organizer: { name: firm.firmName, email: firm.email },
		attendees
	});
	// ical-generator has no time-zone data of its own: add the VTIMEZONE the TZID points at.
	const text = cal.toString();
	const zone = vtimezone(tz, new TZDate(visit.startsAt.getTime(), tz).getFullYear());
	return text.replace('BEGIN:VEVENT', `${zone}\r\nBEGIN:VEVENT`);
}

function attachment(p: VisitParty, method: 'REQUEST' | 'CANCEL') {
	return {
		filename: method === 'CANCEL' ? 'cancelled-visit.ics' : 'site-visit.ics',
		content: visitIcs(p, method),
		contentType: `text/calendar; charset=utf-8; method=${method}`
	};
}

export type VisitMailKind = 'booked' | 'rescheduled' | 'cancelled' | 'reminder';

/** 'today, ' or 'tomorrow, ' as seen when the reminder is written (it may go out hours before). */
function dayWord(p: VisitParty, now: Date): string {
	const day = relativeDay(p.visit.startsAt, now, p.visit.timeZone);
	return day ? `${day}, ` : '';
}

const SUBJECTS: Record<VisitMailKind, (p: VisitParty, now: Date) => string> = {
	booked: (p) => `Site visit booked: ${whenText(p.visit)} (R-${p.leadNumber})`,
	rescheduled: (p) => `Site visit moved: ${whenText(p.visit)} (R-${p.leadNumber})`,
	cancelled: (p) => `Site visit cancelled (R-${p.leadNumber})`,
	reminder: (p, now) =>
		`Reminder: site visit ${dayWord(p, now)}${whenText(p.visit)} (R-${p.leadNumber})`
};

function homeownerText(
	p: VisitParty,
	kind: VisitMailKind,
	link: string | null,
	now: Date
): string[] {
	const first = p.homeowner.name.split(' ')[0] || p.homeowner.name;
	const lines = [`Hello ${first},`];
	if (kind === 'cancelled') {
		lines.push(
			`The site visit on ${whenText(p.visit)} at ${p.address} is cancelled.`,
			`If you would like another time, reply to this e-mail or call ${p.firm.phone}.`
		);
		return lines;
	}
	const verb = {
		booked: 'is booked for',
		rescheduled: 'has moved to',
		reminder: `is coming up: ${dayWord(p, now)}`
	}[kind];
	lines.push(
		`Your site visit with ${p.salesperson.name} from ${p.firm.firmName} ${verb} ${whenText(p.visit)}, at ${p.address}.`
	);
	if (p.visit.noteForHomeowner) lines.push(p.visit.noteForHomeowner);
	lines.push('What helps at the visit:', ...VISIT_HELPS.map((h) => `• ${h}`), DIG_CAUTION);
	if (link) {
		lines.push(
			`Confirm the time, ask for another, or cancel, on your private page (no sign-in): ${link}`
		);
	}
	return lines;
}

function salespersonText(p: VisitParty, kind: VisitMailKind, now: Date): string[] {
	const soon = dayWord(p, now).replace(', ', '');
	const what = {
		booked: 'Booked',
		rescheduled: 'Moved',
		cancelled: 'Cancelled',
		reminder: soon ? soon[0].toUpperCase() + soon.slice(1) : 'Coming up'
	}[kind];
	return [
		`${what}: site visit for R-${p.leadNumber}, ${p.homeowner.name}.`,
		`${whenText(p.visit)} at ${p.address}.`,
		`Agenda: ${origin()}/office/visits?day=${calendarDate(p.visit.startsAt, p.visit.timeZone)}`
	];
}

/**
 * Writes the mails for one change of a visit, to both parties. The dedupe key names the visit,
 * its SEQUENCE and the kind: a retried request or a job run twice never writes a second copy.
 * Returns the outbox ids written (to dispatch after commit).
 */
export async function writeVisitMails(
	tx: Tx,
	p: VisitParty,
	kind: VisitMailKind,
	homeownerToken: string | null,
	now = new Date()
): Promise<string[]> {
	const ids: string[] = [];
	const method = kind === 'cancelled' ? 'CANCEL' : 'REQUEST';
	const files = kind === 'reminder' ? [] : [attachment(p, method)];
	const link = homeownerToken ? `${origin()}/visit/${homeownerToken}` : null;
	const footer = `${p.firm.firmName} · ${p.firm.phone} · ${p.firm.email}`;
	const key = `visit:${p.visit.id}:${p.visit.sequence}:${kind}`;
	if (p.homeowner.email) {
		const paragraphs = homeownerText(p, kind, link, now);
		const id = await writeMail(
			{
				dedupeKey: `${key}:homeowner`,
				to: p.homeowner.email,
				subject: SUBJECTS[kind](p, now),
				text: [...paragraphs, '', footer].join('\n\n'),
				html: htmlBody(
					paragraphs.filter((l) => !link || !l.includes(link)),
					link && kind !== 'cancelled' ? { label: 'Open your visit page', url: link } : undefined,
					footer
				),
				attachments: files,
				leadId: p.visit.leadId
			},
			tx
		);
		if (id) ids.push(id);
	}
	const paragraphs = salespersonText(p, kind, now);
	const id = await writeMail(
		{
			dedupeKey: `${key}:salesperson`,
			to: p.salesperson.email,
			subject: SUBJECTS[kind](p, now),
			text: paragraphs.join('\n\n'),
			html: htmlBody(paragraphs, undefined, footer),
			attachments: files,
			leadId: p.visit.leadId
		},
		tx
	);
	if (id) ids.push(id);
	return ids;
}
