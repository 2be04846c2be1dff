// A season's service visits: made from the active plans (one per plan, feature and visit kind
// in a season; the unique key makes a second run add nothing), crew days to put them in, a
// proposed schedule (the pure planner in $lib/care/route), moves by the owner, and the mail
// that tells each homeowner their date with a link to ask for another.
import { and, asc, eq, gte, inArray, isNotNull, isNull, lte, ne, or, sql } from 'drizzle-orm';
import { db } from '../platform/db';
import {
	careCrewDays,
	carePlans,
	careSubscriptions,
	contacts,
	properties,
	propertyFeatures,
	propertyLocations,
	serviceVisits,
	users,
	type CareCrewDay
} from '../platform/db/schema';
import { newId, sha256 } from '../platform/crypto';
import { origin } from '../platform/env';
import { writeMail } from '../platform/outbox';
import { firmOn } from '../payments/mail';
import { dispatchAll } from '../payments/ledger';
import { firmSettings } from '../platform/settings';
import {
	VISIT_LABELS,
	VISIT_SEASON,
	visitPrice,
	type FeatureKind,
	type FeatureSize
} from '$lib/care/kinds';
import { parseSeasonKey, seasonWindow } from '$lib/care/seasons';
import { nearestNeighbourOrder, planSeason, type PlanStop } from '$lib/care/route';
import { CareError, dayIn, type Tx } from './db';
import { addressOf, locateByPostal } from './features';
import { newCareLink } from './links';
import { build, dayText } from './mail';
import { seasonSettings } from './plans';
import { billedPerVisit } from './subscriptions';
import { addDays, weekdayOf } from '$lib/scheduling/zone';

/** Straight-line to road distance (common practice, no source). */
const ROAD_FACTOR = 1.3;

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

export interface CrewDaysInput {
	from: string;
	to: string;
	crewLeadId: string;
	startMinute: number;
	endMinute: number;
	weekdaysOnly: boolean;
}

export async function addCrewDays(input: CrewDaysInput): Promise<number> {
	const [lead] = await db
		.select({ id: users.id })
		.from(users)
		.where(and(eq(users.id, input.crewLeadId), eq(users.role, 'crew'), isNull(users.disabledAt)));
	if (!lead) throw new CareError('invalid', 'Pick a crew lead.');
	const rows = [];
	for (let day = input.from; day <= input.to; day = addDays(day, 1)) {
		const weekday = weekdayOf(day);
		if (input.weekdaysOnly && (weekday === 0 || weekday === 6)) continue;
		rows.push({
			id: newId(),
			day,
			crewLeadId: input.crewLeadId,
			startMinute: input.startMinute,
			endMinute: input.endMinute
		});
	}
	if (rows.length > 120) throw new CareError('invalid', 'At most 120 days at a time.');
	if (!rows.length) return 0;
	const added = await db
		.insert(careCrewDays)
		.values(rows)
		.onConflictDoNothing()
		.returning({ id: careCrewDays.id });
	return added.length;
}

export async function removeCrewDay(id: string): Promise<void> {
	await db.transaction(async (tx) => {
		await tx
			.update(serviceVisits)
			.set({ day: null, crewDayId: null, crewLeadId: null, routeOrder: null, status: 'due' })
			.where(and(eq(serviceVisits.crewDayId, id), inArray(serviceVisits.status, ['due', 'dated'])));
		await tx.delete(careCrewDays).where(eq(careCrewDays.id, id));
	});
}

async function crewDaysBetween(start: string, end: string, tx: Tx | typeof db = db) {
	return tx
		.select({ d: careCrewDays, leadName: users.name })
		.from(careCrewDays)
		.innerJoin(users, eq(users.id, careCrewDays.crewLeadId))
		.where(and(gte(careCrewDays.day, start), lte(careCrewDays.day, end)))
		.orderBy(asc(careCrewDays.day), asc(users.name));
}

/** The visits of a season with what the board and the planner need. */
async function seasonVisits(key: string, tx: Tx | typeof db = db) {
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

async function routeOptions() {
	const s = await seasonSettings();
	if (s.depotLat === null || s.depotLng === null) {
		throw new CareError(
			'invalid',
			'Set where the crews start from (the yard) in the season settings first.'
		);
	}
	return {
		depot: { lat: s.depotLat, lng: s.depotLng },
		speedKmh: s.speedKmh,
		roadFactor: ROAD_FACTOR
	};
}

/**
 * Proposes dates for the season's visits not yet dated: crew days from today on (in the
 * window), filled by nearest-neighbour routes within each crew's hours. Dated visits keep their
 * day and take their time out of it. Visits with no place on the map stay undated.
 */
export async function proposeSchedule(
	key: string
): Promise<{ placed: number; unplaced: number; unlocated: number }> {
	const window = await seasonRange(key);
	const options = await routeOptions();
	const firm = await firmSettings();
	const from = [window.start, dayIn(firm.timeZone)].sort()[1];
	return db.transaction(async (tx) => {
		await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${'care-plan:' + key}))`);
		const rows = await seasonVisits(key, tx);
		const days = await crewDaysBetween(from, window.end, tx);
		const dated = rows.filter((r) => r.v.status === 'dated' && r.v.crewDayId);
		const busy = new Map<string, number>();
		for (const r of dated) busy.set(r.v.crewDayId!, (busy.get(r.v.crewDayId!) ?? 0) + r.v.minutes);
		const open = rows.filter((r) => r.v.status === 'due');
		const stops: PlanStop[] = open
			.filter((r) => r.lat !== null && r.lng !== null)
			.map((r) => ({
				id: r.v.id,
				lat: r.lat!,
				lng: r.lng!,
				minutes: r.v.minutes,
				windowStart: r.v.windowStart,
				windowEnd: r.v.windowEnd
			}));
		const plan = planSeason(
			stops,
			days.map(({ d }) => ({
				id: d.id,
				day: d.day,
				startMinute: d.startMinute + (busy.get(d.id) ?? 0),
				endMinute: d.endMinute
			})),
			options
		);
		const leadOf = new Map(days.map(({ d }) => [d.id, d]));
		await tx
			.update(serviceVisits)
			.set({ day: null, crewDayId: null, crewLeadId: null, routeOrder: null })
			.where(and(eq(serviceVisits.season, key), eq(serviceVisits.status, 'due')));
		const rowsToSet: {
			id: string;
			day: string;
			crew_day_id: string;
			crew_lead_id: string;
			route_order: number;
		}[] = [];
		for (const day of plan.days) {
			const crewDay = leadOf.get(day.crewDayId)!;
			const offset = dated.filter((r) => r.v.crewDayId === day.crewDayId).length;
			for (const [i, stop] of day.stops.entries()) {
				rowsToSet.push({
					id: stop.id,
					day: day.day,
					crew_day_id: day.crewDayId,
					crew_lead_id: crewDay.crewLeadId,
					route_order: offset + i + 1
				});
			}
		}
		// One statement for the whole season, however many visits it places.
		if (rowsToSet.length) {
			await tx.execute(sql`
				update service_visits as v
				set day = p.day, crew_day_id = p.crew_day_id, crew_lead_id = p.crew_lead_id,
					route_order = p.route_order, updated_at = now()
				from jsonb_to_recordset(${JSON.stringify(rowsToSet)}::jsonb)
					as p(id text, day date, crew_day_id text, crew_lead_id text, route_order int)
				where v.id = p.id`);
		}
		const placed = rowsToSet.length;
		return { placed, unplaced: plan.unplaced.length, unlocated: open.length - stops.length };
	});
}

/** Orders one crew day's visits as a nearest-neighbour route from the yard. */
async function reorderDay(tx: Tx, crewDayId: string, depot: { lat: number; lng: number }) {
	const rows = await tx
		.select({ id: serviceVisits.id, lat: propertyLocations.lat, lng: propertyLocations.lng })
		.from(serviceVisits)
		.leftJoin(propertyLocations, eq(propertyLocations.propertyId, serviceVisits.propertyId))
		.where(and(eq(serviceVisits.crewDayId, crewDayId), ne(serviceVisits.status, 'cancelled')));
	const placed = rows.filter((r) => r.lat !== null && r.lng !== null) as {
		id: string;
		lat: number;
		lng: number;
	}[];
	const order = [...nearestNeighbourOrder(depot, placed), ...rows.filter((r) => r.lat === null)];
	for (const [i, r] of order.entries()) {
		await tx
			.update(serviceVisits)
			.set({ routeOrder: i + 1 })
			.where(eq(serviceVisits.id, r.id));
	}
}

/** The owner moves a visit to another crew day (inside its window); both days are re-routed. */
export async function moveVisit(visitId: string, crewDayId: string): Promise<void> {
	const options = await routeOptions();
	await db.transaction(async (tx) => {
		const [v] = await tx
			.select()
			.from(serviceVisits)
			.where(eq(serviceVisits.id, visitId))
			.for('update');
		if (!v) throw new CareError('not_found', 'There is no such service visit.');
		if (v.status !== 'due' && v.status !== 'dated') {
			throw new CareError('invalid', 'Only a visit not yet done can move.');
		}
		const [day] = await tx.select().from(careCrewDays).where(eq(careCrewDays.id, crewDayId));
		if (!day) throw new CareError('invalid', 'Pick a crew day.');
		if (day.day < v.windowStart || day.day > v.windowEnd) {
			throw new CareError(
				'invalid',
				`${dayText(day.day)} is outside this visit's window (${dayText(v.windowStart)} to ${dayText(v.windowEnd)}).`
			);
		}
		await tx
			.update(serviceVisits)
			.set({ day: day.day, crewDayId: day.id, crewLeadId: day.crewLeadId, routeOrder: 9999 })
			.where(eq(serviceVisits.id, visitId));
		await reorderDay(tx, day.id, options.depot);
		if (v.crewDayId && v.crewDayId !== day.id) await reorderDay(tx, v.crewDayId, options.depot);
	});
}

/**
 * Mails each homeowner the day of their visits (one mail per property and day) with a link to
 * ask for another; a visit moved after its mail is mailed again. Cancelled plans get nothing.
 */
export async function sendDates(key: string): Promise<number> {
	const rows = await db
		.select({ v: serviceVisits })
		.from(serviceVisits)
		.innerJoin(careSubscriptions, eq(careSubscriptions.id, serviceVisits.subscriptionId))
		.where(
			and(
				eq(serviceVisits.season, key),
				inArray(serviceVisits.status, ['due', 'dated']),
				isNotNull(serviceVisits.day),
				eq(careSubscriptions.status, 'active'),
				or(isNull(serviceVisits.notifiedDay), ne(serviceVisits.notifiedDay, serviceVisits.day))
			)
		);
	const groups = new Map<string, typeof rows>();
	for (const r of rows) {
		const k = `${r.v.propertyId}|${r.v.day}`;
		groups.set(k, [...(groups.get(k) ?? []), r]);
	}
	let sent = 0;
	for (const group of groups.values()) {
		const ids = await db.transaction(async (tx) => {
			const first = group[0].v;
			const [p] = await tx
				.select({ property: properties, contact: contacts })
				.from(properties)
				.innerJoin(contacts, eq(contacts.id, properties.contactId))
				.where(eq(properties.id, first.propertyId));
			await tx
				.update(serviceVisits)
				.set({ status: 'dated', notifiedDay: first.day })
				.where(
					inArray(
						serviceVisits.id,
						group.map((r) => r.v.id)
					)
				);
			if (!p.contact.email) return [];
			const firm = await firmOn(tx);
			const token = await newCareLink(first.propertyId, first.id, tx);
			const kinds = [
				...new Set(group.map((r) => VISIT_LABELS[r.v.kind as keyof typeof VISIT_LABELS]))
			];
			const mail = build(
				firm,
				`Your ${kinds.join(' and ').toLowerCase()}: ${dayText(first.day!)}`,
				[
					`Hello ${p.contact.name},`,
					`We will come to ${addressOf(p.property)} on ${dayText(first.day!)} for the ${kinds.join(' and ').toLowerCase()} of your care plan. You need not be home; please leave the gate unlocked and the outdoor outlet on.`,
					`If the day does not suit you, ask for another from the link below.`
				],
				{ label: 'See the visit or ask for another day', url: `${origin()}/care/visit/${token}` }
			);
			const dedupe = sha256(
				group
					.map((r) => r.v.id)
					.sort()
					.join(',')
			);
			const id = await writeMail(
				{ ...mail, to: p.contact.email, dedupeKey: `care-visit-date:${dedupe}:${first.day}` },
				tx
			);
			return id ? [id] : [];
		});
		sent += ids.length;
		await dispatchAll(ids);
	}
	return sent;
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
