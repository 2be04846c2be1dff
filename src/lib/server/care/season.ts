// A season's service visits: made from the active plans (one per plan, feature and visit kind
// in a season; the unique key makes a second run add nothing), and the board the season page
// shows. Crew days are in crew-days.ts, the proposed routes and moves in season-routes.ts, the
// mail of the dates in season-mail.ts.
import { and, asc, eq, inArray, lte, sql } from 'drizzle-orm';
import { db } from '../platform/db';
import {
	carePlans,
	careSubscriptions,
	contacts,
	properties,
	propertyFeatures,
	propertyLocations,
	serviceVisits,
	type CareCrewDay
} from '../platform/db/schema';
import { newId } from '../platform/crypto';
import { VISIT_SEASON, visitPrice, type FeatureKind, type FeatureSize } from '$lib/care/kinds';
import { parseSeasonKey, seasonWindow } from '$lib/care/seasons';
import { CareError, type Tx } from './db';
import { locateByPostal } from './features';
import { seasonSettings } from './plans';
import { billedPerVisit } from './subscriptions';
import { crewDaysBetween } from './crew-days';

function season(key: string) {
	const parsed = parseSeasonKey(key);
	if (!parsed) throw new CareError('invalid', 'Pick a season such as autumn-2027.');
	return parsed;
}

export async function seasonRange(key: string) {
	const { season: s, year } = season(key);
	return seasonWindow(s, year, await seasonSettings());
}

/** Makes the season's visits from every active plan; returns how many were new. */
export async function generateSeason(key: string): Promise<{ created: number; total: number }> {
	const { season: name, year } = season(key);
	const settings = await seasonSettings();
	const window = seasonWindow(name, year, settings);
	const subs = await db
		.select({ s: careSubscriptions, plan: carePlans })
		.from(careSubscriptions)
		.innerJoin(carePlans, eq(carePlans.id, careSubscriptions.planId))
		.where(
			and(eq(careSubscriptions.status, 'active'), lte(careSubscriptions.startsOn, window.end))
		);
	let created = 0;
	const located = new Set<string>();
	for (const { s, plan } of subs) {
		const visits = plan.visits.filter((v) => VISIT_SEASON[v.kind] === name);
		if (!visits.length || !s.featureIds.length) continue;
		const features = await db
			.select()
			.from(propertyFeatures)
			.where(inArray(propertyFeatures.id, s.featureIds));
		for (const v of visits) {
			for (const f of features) {
				const cents = visitPrice(plan.prices, v.kind, {
					kind: f.kind as FeatureKind,
					size: f.size as FeatureSize
				});
				if (cents === null) continue;
				const rows = await db
					.insert(serviceVisits)
					.values({
						id: newId(),
						subscriptionId: s.id,
						featureId: f.id,
						propertyId: s.propertyId,
						kind: v.kind,
						season: key,
						windowStart: window.start,
						windowEnd: window.end,
						minutes: v.minutes,
						priceCents: cents,
						billedPerVisit: billedPerVisit(s, window.start),
						checklist: v.checklist.map((item) => ({ item, done: false }))
					})
					.onConflictDoNothing()
					.returning({ id: serviceVisits.id });
				created += rows.length;
			}
		}
		if (!located.has(s.propertyId)) {
			located.add(s.propertyId);
			await locateByPostal(s.propertyId);
		}
	}
	const [{ n }] = await db
		.select({ n: sql<number>`count(*)::int` })
		.from(serviceVisits)
		.where(eq(serviceVisits.season, key));
	return { created, total: n };
}

/** The visits of a season with what the board and the planner need. */
export async function seasonVisits(key: string, tx: Tx | typeof db = db) {
	return tx
		.select({
			v: serviceVisits,
			name: contacts.name,
			street: properties.street,
			town: properties.town,
			postalCode: properties.postalCode,
			feature: propertyFeatures.kind,
			lat: propertyLocations.lat,
			lng: propertyLocations.lng
		})
		.from(serviceVisits)
		.innerJoin(properties, eq(properties.id, serviceVisits.propertyId))
		.innerJoin(contacts, eq(contacts.id, properties.contactId))
		.innerJoin(propertyFeatures, eq(propertyFeatures.id, serviceVisits.featureId))
		.leftJoin(propertyLocations, eq(propertyLocations.propertyId, serviceVisits.propertyId))
		.where(eq(serviceVisits.season, key))
		.orderBy(asc(serviceVisits.day), asc(serviceVisits.routeOrder), asc(contacts.name));
}

/** What the season page shows: crew days with their routes, and the visits still undated. */
export async function seasonBoard(key: string) {
	const window = await seasonRange(key);
	const [rows, days] = await Promise.all([
		seasonVisits(key),
		crewDaysBetween(window.start, window.end)
	]);
	const visit = (r: (typeof rows)[number]) => ({
		id: r.v.id,
		kind: r.v.kind,
		status: r.v.status,
		feature: r.feature,
		name: r.name,
		address: [r.street, r.town].filter(Boolean).join(', '),
		located: r.lat !== null,
		routeOrder: r.v.routeOrder,
		minutes: r.v.minutes,
		changeRequest: r.v.changeRequest,
		notified: r.v.notifiedDay === r.v.day && r.v.day !== null
	});
	return {
		window,
		crewDays: days.map(({ d, leadName }) => ({
			...d,
			leadName,
			visits: rows.filter((r) => r.v.crewDayId === d.id && r.v.status !== 'cancelled').map(visit)
		})),
		undated: rows
			.filter((r) => !r.v.crewDayId && (r.v.status === 'due' || r.v.status === 'dated'))
			.map(visit),
		counts: {
			total: rows.length,
			done: rows.filter((r) => r.v.status === 'done').length,
			cancelled: rows.filter((r) => r.v.status === 'cancelled').length,
			toMail: rows.filter(
				(r) =>
					r.v.day && (r.v.status === 'due' || r.v.status === 'dated') && r.v.notifiedDay !== r.v.day
			).length
		}
	};
}

export type { CareCrewDay };
