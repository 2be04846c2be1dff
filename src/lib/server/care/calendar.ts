// Each staff member's private calendar subscription (RFC 5545, made with ical-generator): their
// site visits (timed), install days and service visits (all-day, in route order), in the firm's
// time zone. The URL carries a 160-bit token; only its SHA-256 is kept, so the address is shown
// once when it is made, and making a new one stops the old one working.
import { TZDate } from '@date-fns/tz';
import { and, asc, eq, gte, inArray, lte } from 'drizzle-orm';
import ical, { ICalEventStatus } from 'ical-generator';
import { vtimezone } from '$lib/scheduling/vtimezone';
import { VISIT_LABELS, type VisitKind } from '$lib/care/kinds';
import { db } from '../platform/db';
import {
	calendarFeeds,
	contacts,
	jobDays,
	jobs,
	leads,
	properties,
	serviceVisits,
	siteVisits,
	users
} from '../platform/db/schema';
import { newToken, sha256 } from '../platform/crypto';
import { origin } from '../platform/env';
import { firmSettings } from '../platform/settings';
import { addressOf } from './features';
import { calendarDate } from '$lib/scheduling/zone';

const DAYS_BACK = 60;
const DAYS_AHEAD = 365;

/** Makes (or replaces) the person's feed token and returns the new address. */
export async function resetFeed(userId: string): Promise<string> {
	const token = newToken();
	await db
		.insert(calendarFeeds)
		.values({ userId, tokenHash: sha256(token) })
		.onConflictDoUpdate({
			target: calendarFeeds.userId,
			set: { tokenHash: sha256(token), createdAt: new Date() }
		});
	return feedUrl(token);
}

export function feedUrl(token: string): string {
	return `${origin()}/calendar/${token}`;
}

export async function feedMadeAt(userId: string): Promise<Date | null> {
	const [row] = await db.select().from(calendarFeeds).where(eq(calendarFeeds.userId, userId));
	return row?.createdAt ?? null;
}

const day = (d: string, tz: string) => {
	const [y, m, dd] = d.split('-').map(Number);
	return new TZDate(y, m - 1, dd, tz);
};

/** The feed of the person whose token this is, or null for an unknown token or a disabled user. */
export async function calendarFeed(token: string, now = new Date()): Promise<string | null> {
	if (!token || token.length > 200) return null;
	const [row] = await db
		.select({ user: users })
		.from(calendarFeeds)
		.innerJoin(users, eq(users.id, calendarFeeds.userId))
		.where(eq(calendarFeeds.tokenHash, sha256(token)));
	if (!row || row.user.disabledAt) return null;
	const user = row.user;
	const firm = await firmSettings();
	const tz = firm.timeZone;
	const from = new Date(now.getTime() - DAYS_BACK * 86_400_000);
	const to = new Date(now.getTime() + DAYS_AHEAD * 86_400_000);
	const fromDay = calendarDate(from, tz);
	const toDay = calendarDate(to, tz);

	const [visits, installs, services] = await Promise.all([
		db
			.select({ v: siteVisits, name: contacts.name, property: properties, number: leads.number })
			.from(siteVisits)
			.innerJoin(leads, eq(leads.id, siteVisits.leadId))
			.innerJoin(contacts, eq(contacts.id, leads.contactId))
			.leftJoin(properties, eq(properties.id, leads.propertyId))
			.where(
				and(
					eq(siteVisits.salespersonId, user.id),
					gte(siteVisits.startsAt, from),
					lte(siteVisits.startsAt, to)
				)
			)
			.orderBy(asc(siteVisits.startsAt)),
		db
			.select({ day: jobDays.day, job: jobs, property: properties })
			.from(jobDays)
			.innerJoin(jobs, eq(jobs.id, jobDays.jobId))
			.leftJoin(properties, eq(properties.id, jobs.propertyId))
			.where(and(eq(jobs.crewLeadId, user.id), gte(jobDays.day, fromDay), lte(jobDays.day, toDay))),
		db
			.select({ v: serviceVisits, name: contacts.name, property: properties })
			.from(serviceVisits)
			.innerJoin(properties, eq(properties.id, serviceVisits.propertyId))
			.innerJoin(contacts, eq(contacts.id, properties.contactId))
			.where(
				and(
					eq(serviceVisits.crewLeadId, user.id),
					inArray(serviceVisits.status, ['dated', 'done']),
					gte(serviceVisits.day, fromDay),
					lte(serviceVisits.day, toDay)
				)
			)
			.orderBy(asc(serviceVisits.day), asc(serviceVisits.routeOrder))
	]);

	const cal = ical({
		prodId: { company: 'Rillstone', product: 'staff-calendar', language: 'EN' },
		name: `${firm.firmName}: ${user.name}`,
		timezone: tz
	});
	for (const { v, name, property, number } of visits) {
		cal.createEvent({
			id: `site-visit-${v.id}@rillstone`,
			sequence: v.sequence,
			stamp: now,
			start: new TZDate(v.startsAt.getTime(), tz),
			end: new TZDate(v.endsAt.getTime(), tz),
			timezone: tz,
			summary: `Site visit: ${name} (R-${number})`,
			location: property ? addressOf(property) : undefined,
			url: `${origin()}/office/visits/${v.id}`,
			status: v.status === 'cancelled' ? ICalEventStatus.CANCELLED : ICalEventStatus.CONFIRMED
		});
	}
	for (const { day: d, job, property } of installs) {
		cal.createEvent({
			id: `install-${job.id}-${d}@rillstone`,
			stamp: now,
			start: day(d, tz),
			allDay: true,
			summary: `Install: J-${job.number} ${job.title}`,
			location: property ? addressOf(property) : undefined,
			url: `${origin()}/office/jobs/${job.id}`
		});
	}
	for (const { v, name, property } of services) {
		cal.createEvent({
			id: `service-visit-${v.id}@rillstone`,
			stamp: now,
			start: day(v.day!, tz),
			allDay: true,
			summary: `${v.routeOrder ?? ''}. ${VISIT_LABELS[v.kind as VisitKind] ?? v.kind}: ${name}`,
			location: addressOf(property),
			url: `${origin()}/office/care/visits/${v.id}`,
			status: v.status === 'done' ? ICalEventStatus.CONFIRMED : ICalEventStatus.TENTATIVE
		});
	}
	// ical-generator has no time-zone data of its own: add the VTIMEZONE the TZIDs point at,
	// covering the years around the middle of the feed's window.
	const middle = new TZDate((from.getTime() + to.getTime()) / 2, tz).getFullYear();
	const text = cal.toString();
	const zone = vtimezone(tz, middle);
	return text.includes('BEGIN:VEVENT')
		? text.replace('BEGIN:VEVENT', `${zone}\r\nBEGIN:VEVENT`)
		: text.replace('END:VCALENDAR', `${zone}\r\nEND:VCALENDAR`);
}
